CREATE TABLE `harness_clamp_wires` (
	`clamp_id` varchar(26) NOT NULL,
	`position` int NOT NULL,
	`revision_id` varchar(26) NOT NULL,
	`wire_id` varchar(26) NOT NULL,
	CONSTRAINT `harness_clamp_wires_pk` PRIMARY KEY(`clamp_id`,`position`)
);
--> statement-breakpoint
CREATE TABLE `harness_clamps` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`revision_id` varchar(26) NOT NULL,
	`position` int NOT NULL,
	`clamp_key` varchar(32) NOT NULL,
	`label` varchar(255),
	`fields` longtext NOT NULL,
	CONSTRAINT `harness_clamps_id` PRIMARY KEY(`id`),
	CONSTRAINT `harness_clamps_revision_key_unique` UNIQUE(`revision_id`,`clamp_key`)
);
--> statement-breakpoint
CREATE TABLE `harness_components` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`revision_id` varchar(26) NOT NULL,
	`position` int NOT NULL,
	`component_key` varchar(32) NOT NULL,
	`kind` varchar(20) NOT NULL,
	`label` varchar(255),
	`notes` text,
	`pins_key` varchar(16),
	`fields` longtext NOT NULL,
	`x` double,
	`y` double,
	CONSTRAINT `harness_components_id` PRIMARY KEY(`id`),
	CONSTRAINT `harness_components_revision_key_unique` UNIQUE(`revision_id`,`component_key`)
);
--> statement-breakpoint
CREATE TABLE `equipment_models` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`kind` enum('machine','attachment') NOT NULL,
	`maker` varchar(100) NOT NULL,
	`model` varchar(100) NOT NULL,
	`series` varchar(100),
	`notes` text,
	`created_at` datetime(3) NOT NULL,
	`updated_at` datetime(3) NOT NULL,
	CONSTRAINT `equipment_models_id` PRIMARY KEY(`id`),
	CONSTRAINT `equipment_models_shop_maker_model_unique` UNIQUE(`shop_id`,`maker`,`model`)
);
--> statement-breakpoint
CREATE TABLE `harnesses` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`model_id` varchar(26),
	`name` varchar(200) NOT NULL,
	`created_by` varchar(26),
	`created_at` datetime(3) NOT NULL,
	`updated_at` datetime(3) NOT NULL,
	CONSTRAINT `harnesses_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `harness_pins` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`revision_id` varchar(26) NOT NULL,
	`component_id` varchar(26) NOT NULL,
	`position` int NOT NULL,
	`pin_key` varchar(16) NOT NULL,
	`source` enum('fixed','string','object') NOT NULL,
	`role` varchar(20),
	`function` varchar(255),
	`fields` longtext,
	CONSTRAINT `harness_pins_id` PRIMARY KEY(`id`),
	CONSTRAINT `harness_pins_component_key_unique` UNIQUE(`component_id`,`pin_key`)
);
--> statement-breakpoint
CREATE TABLE `revisions` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`harness_id` varchar(26) NOT NULL,
	`number` int NOT NULL,
	`status` enum('draft','published') NOT NULL,
	`version` int NOT NULL DEFAULT 1,
	`draft_slot` tinyint,
	`parent_revision_id` varchar(26),
	`format` varchar(40) NOT NULL,
	`format_version` int NOT NULL,
	`name` varchar(500) NOT NULL,
	`nominal_volts` double NOT NULL,
	`temperature_c` double,
	`notes` text,
	`messages` longtext,
	`extra` longtext,
	`created_by` varchar(26),
	`created_at` datetime(3) NOT NULL,
	`updated_by` varchar(26),
	`updated_at` datetime(3) NOT NULL,
	`published_by` varchar(26),
	`published_at` datetime(3),
	`publish_note` text,
	CONSTRAINT `revisions_id` PRIMARY KEY(`id`),
	CONSTRAINT `revisions_harness_number_unique` UNIQUE(`harness_id`,`number`),
	CONSTRAINT `revisions_one_draft_unique` UNIQUE(`harness_id`,`draft_slot`)
);
--> statement-breakpoint
CREATE TABLE `harness_states` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`revision_id` varchar(26) NOT NULL,
	`position` int NOT NULL,
	`state_key` varchar(32) NOT NULL,
	`label` varchar(255),
	`body` longtext NOT NULL,
	CONSTRAINT `harness_states_id` PRIMARY KEY(`id`),
	CONSTRAINT `harness_states_revision_key_unique` UNIQUE(`revision_id`,`state_key`)
);
--> statement-breakpoint
CREATE TABLE `harness_wires` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`revision_id` varchar(26) NOT NULL,
	`position` int NOT NULL,
	`wire_key` varchar(32) NOT NULL,
	`from_pin_id` varchar(26) NOT NULL,
	`to_pin_id` varchar(26) NOT NULL,
	`color` varchar(16),
	`size` longtext,
	`length_m` double,
	`ohms` double,
	`circuit` varchar(64),
	`label` varchar(255),
	`notes` text,
	`extra` longtext,
	CONSTRAINT `harness_wires_id` PRIMARY KEY(`id`),
	CONSTRAINT `harness_wires_revision_key_unique` UNIQUE(`revision_id`,`wire_key`)
);
--> statement-breakpoint
ALTER TABLE `harness_clamp_wires` ADD CONSTRAINT `harness_clamp_wires_clamp_id_harness_clamps_id_fk` FOREIGN KEY (`clamp_id`) REFERENCES `harness_clamps`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `harness_clamp_wires` ADD CONSTRAINT `harness_clamp_wires_revision_id_revisions_id_fk` FOREIGN KEY (`revision_id`) REFERENCES `revisions`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `harness_clamp_wires` ADD CONSTRAINT `harness_clamp_wires_wire_id_harness_wires_id_fk` FOREIGN KEY (`wire_id`) REFERENCES `harness_wires`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `harness_clamps` ADD CONSTRAINT `harness_clamps_revision_id_revisions_id_fk` FOREIGN KEY (`revision_id`) REFERENCES `revisions`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `harness_components` ADD CONSTRAINT `harness_components_revision_id_revisions_id_fk` FOREIGN KEY (`revision_id`) REFERENCES `revisions`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `equipment_models` ADD CONSTRAINT `equipment_models_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `harnesses` ADD CONSTRAINT `harnesses_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `harnesses` ADD CONSTRAINT `harnesses_model_id_equipment_models_id_fk` FOREIGN KEY (`model_id`) REFERENCES `equipment_models`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `harnesses` ADD CONSTRAINT `harnesses_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `harness_pins` ADD CONSTRAINT `harness_pins_revision_id_revisions_id_fk` FOREIGN KEY (`revision_id`) REFERENCES `revisions`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `harness_pins` ADD CONSTRAINT `harness_pins_component_id_harness_components_id_fk` FOREIGN KEY (`component_id`) REFERENCES `harness_components`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `revisions` ADD CONSTRAINT `revisions_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `revisions` ADD CONSTRAINT `revisions_harness_id_harnesses_id_fk` FOREIGN KEY (`harness_id`) REFERENCES `harnesses`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `revisions` ADD CONSTRAINT `revisions_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `revisions` ADD CONSTRAINT `revisions_updated_by_users_id_fk` FOREIGN KEY (`updated_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `revisions` ADD CONSTRAINT `revisions_published_by_users_id_fk` FOREIGN KEY (`published_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `revisions` ADD CONSTRAINT `revisions_parent_fk` FOREIGN KEY (`parent_revision_id`) REFERENCES `revisions`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `harness_states` ADD CONSTRAINT `harness_states_revision_id_revisions_id_fk` FOREIGN KEY (`revision_id`) REFERENCES `revisions`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `harness_wires` ADD CONSTRAINT `harness_wires_revision_id_revisions_id_fk` FOREIGN KEY (`revision_id`) REFERENCES `revisions`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `harness_wires` ADD CONSTRAINT `harness_wires_from_pin_fk` FOREIGN KEY (`from_pin_id`) REFERENCES `harness_pins`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `harness_wires` ADD CONSTRAINT `harness_wires_to_pin_fk` FOREIGN KEY (`to_pin_id`) REFERENCES `harness_pins`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `harness_clamp_wires_revision_idx` ON `harness_clamp_wires` (`revision_id`);--> statement-breakpoint
CREATE INDEX `harness_components_shop_key_idx` ON `harness_components` (`shop_id`,`component_key`);--> statement-breakpoint
CREATE INDEX `harness_components_shop_label_idx` ON `harness_components` (`shop_id`,`label`);--> statement-breakpoint
CREATE INDEX `equipment_models_shop_kind_idx` ON `equipment_models` (`shop_id`,`kind`);--> statement-breakpoint
CREATE INDEX `harnesses_shop_idx` ON `harnesses` (`shop_id`,`name`);--> statement-breakpoint
CREATE INDEX `harnesses_model_idx` ON `harnesses` (`model_id`);--> statement-breakpoint
CREATE INDEX `harness_pins_revision_idx` ON `harness_pins` (`revision_id`);--> statement-breakpoint
CREATE INDEX `harness_pins_shop_function_idx` ON `harness_pins` (`shop_id`,`function`);--> statement-breakpoint
CREATE INDEX `revisions_shop_status_idx` ON `revisions` (`shop_id`,`status`);--> statement-breakpoint
CREATE INDEX `harness_wires_shop_circuit_idx` ON `harness_wires` (`shop_id`,`circuit`);--> statement-breakpoint
CREATE INDEX `harness_wires_shop_color_idx` ON `harness_wires` (`shop_id`,`color`);--> statement-breakpoint
CREATE INDEX `harness_wires_shop_key_idx` ON `harness_wires` (`shop_id`,`wire_key`);