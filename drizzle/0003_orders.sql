CREATE TABLE `customer_links` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`order_id` varchar(26) NOT NULL,
	`expires_at` datetime(3) NOT NULL,
	`revoked_at` datetime(3),
	`revoked_by` varchar(26),
	`created_by` varchar(26),
	`created_at` datetime(3) NOT NULL,
	`last_opened_at` datetime(3),
	CONSTRAINT `customer_links_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `customers` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`name` varchar(120) NOT NULL,
	`company` varchar(120),
	`email` varchar(254),
	`phone` varchar(40),
	`contacts` longtext NOT NULL,
	`notes` text,
	`version` int NOT NULL DEFAULT 1,
	`created_at` datetime(3) NOT NULL,
	`updated_at` datetime(3) NOT NULL,
	CONSTRAINT `customers_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `order_attachments` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`order_id` varchar(26) NOT NULL,
	`kind` enum('photo','file') NOT NULL,
	`filename` varchar(200) NOT NULL,
	`content_type` varchar(100) NOT NULL,
	`size` int NOT NULL,
	`storage_key` varchar(200) NOT NULL,
	`thumb_key` varchar(200),
	`width` int,
	`height` int,
	`caption` varchar(300),
	`in_report` boolean NOT NULL DEFAULT false,
	`uploaded_by` varchar(26),
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `order_attachments_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `order_drawings` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`order_id` varchar(26) NOT NULL,
	`revision_id` varchar(26) NOT NULL,
	`harness_name` varchar(500) NOT NULL,
	`revision_number` int,
	`title` varchar(200) NOT NULL,
	`viewport` longtext,
	`highlight` longtext NOT NULL,
	`markers` longtext NOT NULL,
	`notes` text,
	`snapshot` longtext NOT NULL,
	`in_report` boolean NOT NULL DEFAULT true,
	`version` int NOT NULL DEFAULT 1,
	`created_by` varchar(26),
	`created_at` datetime(3) NOT NULL,
	`updated_at` datetime(3) NOT NULL,
	CONSTRAINT `order_drawings_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `order_procedure_steps` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`order_procedure_id` varchar(26) NOT NULL,
	`position` int NOT NULL,
	`text` text NOT NULL,
	`done_by` varchar(26),
	`done_at` datetime(3),
	CONSTRAINT `order_procedure_steps_id` PRIMARY KEY(`id`),
	CONSTRAINT `order_procedure_steps_position_unique` UNIQUE(`order_procedure_id`,`position`)
);
--> statement-breakpoint
CREATE TABLE `order_procedures` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`order_id` varchar(26) NOT NULL,
	`procedure_id` varchar(26),
	`title` varchar(200) NOT NULL,
	`notes` text,
	`attached_by` varchar(26),
	`attached_at` datetime(3) NOT NULL,
	CONSTRAINT `order_procedures_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `order_settings` (
	`shop_id` varchar(26) NOT NULL,
	`last_order_number` int NOT NULL DEFAULT 0,
	`stalled_diagnosis_hours` double NOT NULL DEFAULT 4,
	`stalled_days` int,
	`link_days` int NOT NULL DEFAULT 14,
	`link_key` varchar(64) NOT NULL,
	`updated_at` datetime(3) NOT NULL,
	CONSTRAINT `order_settings_shop_id` PRIMARY KEY(`shop_id`)
);
--> statement-breakpoint
CREATE TABLE `procedures` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`title` varchar(200) NOT NULL,
	`notes` text,
	`steps` longtext NOT NULL,
	`version` int NOT NULL DEFAULT 1,
	`created_by` varchar(26),
	`created_at` datetime(3) NOT NULL,
	`updated_at` datetime(3) NOT NULL,
	CONSTRAINT `procedures_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `repair_order_units` (
	`order_id` varchar(26) NOT NULL,
	`unit_id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`position` int NOT NULL,
	CONSTRAINT `repair_order_units_pk` PRIMARY KEY(`order_id`,`unit_id`)
);
--> statement-breakpoint
CREATE TABLE `repair_orders` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`number` int NOT NULL,
	`customer_id` varchar(26) NOT NULL,
	`status` enum('open','diagnosing','waiting_on_parts','ready','closed') NOT NULL,
	`complaint` text NOT NULL,
	`cause` text,
	`correction` text,
	`labour_notes` text,
	`internal_notes` text,
	`customer_notes` text,
	`assigned_tech_id` varchar(26),
	`opened_by` varchar(26),
	`opened_at` datetime(3) NOT NULL,
	`closed_at` datetime(3),
	`stalled_notified_at` datetime(3),
	`version` int NOT NULL DEFAULT 1,
	`updated_at` datetime(3) NOT NULL,
	CONSTRAINT `repair_orders_id` PRIMARY KEY(`id`),
	CONSTRAINT `repair_orders_shop_number_unique` UNIQUE(`shop_id`,`number`)
);
--> statement-breakpoint
CREATE TABLE `report_sends` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`order_id` varchar(26) NOT NULL,
	`sent_by` varchar(26),
	`sent_at` datetime(3) NOT NULL,
	`to_addr` varchar(254) NOT NULL,
	`subject` varchar(300) NOT NULL,
	`filename` varchar(200) NOT NULL,
	`bytes` int NOT NULL,
	`message_id` varchar(255),
	`link_id` varchar(26),
	CONSTRAINT `report_sends_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `time_entries` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`order_id` varchar(26) NOT NULL,
	`tech_id` varchar(26) NOT NULL,
	`kind` enum('diagnosis','repair','other') NOT NULL,
	`minutes` int NOT NULL,
	`work_date` date NOT NULL,
	`note` varchar(1000),
	`created_by` varchar(26),
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `time_entries_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `units` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`customer_id` varchar(26) NOT NULL,
	`kind` enum('machine','attachment') NOT NULL,
	`model_id` varchar(26),
	`description` varchar(200),
	`serial_number` varchar(60) NOT NULL,
	`hour_meter` double,
	`notes` text,
	`version` int NOT NULL DEFAULT 1,
	`created_at` datetime(3) NOT NULL,
	`updated_at` datetime(3) NOT NULL,
	CONSTRAINT `units_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `customer_links` ADD CONSTRAINT `customer_links_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `customer_links` ADD CONSTRAINT `customer_links_order_id_repair_orders_id_fk` FOREIGN KEY (`order_id`) REFERENCES `repair_orders`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `customer_links` ADD CONSTRAINT `customer_links_revoked_by_users_id_fk` FOREIGN KEY (`revoked_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `customer_links` ADD CONSTRAINT `customer_links_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `customers` ADD CONSTRAINT `customers_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `order_attachments` ADD CONSTRAINT `order_attachments_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `order_attachments` ADD CONSTRAINT `order_attachments_order_id_repair_orders_id_fk` FOREIGN KEY (`order_id`) REFERENCES `repair_orders`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `order_attachments` ADD CONSTRAINT `order_attachments_uploaded_by_users_id_fk` FOREIGN KEY (`uploaded_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `order_drawings` ADD CONSTRAINT `order_drawings_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `order_drawings` ADD CONSTRAINT `order_drawings_order_id_repair_orders_id_fk` FOREIGN KEY (`order_id`) REFERENCES `repair_orders`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `order_drawings` ADD CONSTRAINT `order_drawings_revision_id_revisions_id_fk` FOREIGN KEY (`revision_id`) REFERENCES `revisions`(`id`) ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `order_drawings` ADD CONSTRAINT `order_drawings_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `order_procedure_steps` ADD CONSTRAINT `order_procedure_steps_order_procedure_id_order_procedures_id_fk` FOREIGN KEY (`order_procedure_id`) REFERENCES `order_procedures`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `order_procedure_steps` ADD CONSTRAINT `order_procedure_steps_done_by_users_id_fk` FOREIGN KEY (`done_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `order_procedures` ADD CONSTRAINT `order_procedures_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `order_procedures` ADD CONSTRAINT `order_procedures_order_id_repair_orders_id_fk` FOREIGN KEY (`order_id`) REFERENCES `repair_orders`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `order_procedures` ADD CONSTRAINT `order_procedures_procedure_id_procedures_id_fk` FOREIGN KEY (`procedure_id`) REFERENCES `procedures`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `order_procedures` ADD CONSTRAINT `order_procedures_attached_by_users_id_fk` FOREIGN KEY (`attached_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `order_settings` ADD CONSTRAINT `order_settings_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `procedures` ADD CONSTRAINT `procedures_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `procedures` ADD CONSTRAINT `procedures_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `repair_order_units` ADD CONSTRAINT `repair_order_units_order_id_repair_orders_id_fk` FOREIGN KEY (`order_id`) REFERENCES `repair_orders`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `repair_order_units` ADD CONSTRAINT `repair_order_units_unit_id_units_id_fk` FOREIGN KEY (`unit_id`) REFERENCES `units`(`id`) ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `repair_orders` ADD CONSTRAINT `repair_orders_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `repair_orders` ADD CONSTRAINT `repair_orders_customer_id_customers_id_fk` FOREIGN KEY (`customer_id`) REFERENCES `customers`(`id`) ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `repair_orders` ADD CONSTRAINT `repair_orders_assigned_tech_id_users_id_fk` FOREIGN KEY (`assigned_tech_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `repair_orders` ADD CONSTRAINT `repair_orders_opened_by_users_id_fk` FOREIGN KEY (`opened_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `report_sends` ADD CONSTRAINT `report_sends_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `report_sends` ADD CONSTRAINT `report_sends_order_id_repair_orders_id_fk` FOREIGN KEY (`order_id`) REFERENCES `repair_orders`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `report_sends` ADD CONSTRAINT `report_sends_sent_by_users_id_fk` FOREIGN KEY (`sent_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `time_entries` ADD CONSTRAINT `time_entries_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `time_entries` ADD CONSTRAINT `time_entries_order_id_repair_orders_id_fk` FOREIGN KEY (`order_id`) REFERENCES `repair_orders`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `time_entries` ADD CONSTRAINT `time_entries_tech_id_users_id_fk` FOREIGN KEY (`tech_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `time_entries` ADD CONSTRAINT `time_entries_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `units` ADD CONSTRAINT `units_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `units` ADD CONSTRAINT `units_customer_id_customers_id_fk` FOREIGN KEY (`customer_id`) REFERENCES `customers`(`id`) ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `units` ADD CONSTRAINT `units_model_id_equipment_models_id_fk` FOREIGN KEY (`model_id`) REFERENCES `equipment_models`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `customer_links_order_idx` ON `customer_links` (`order_id`);--> statement-breakpoint
CREATE INDEX `customers_shop_name_idx` ON `customers` (`shop_id`,`name`);--> statement-breakpoint
CREATE INDEX `customers_shop_company_idx` ON `customers` (`shop_id`,`company`);--> statement-breakpoint
CREATE INDEX `order_attachments_order_idx` ON `order_attachments` (`order_id`);--> statement-breakpoint
CREATE INDEX `order_drawings_order_idx` ON `order_drawings` (`order_id`);--> statement-breakpoint
CREATE INDEX `order_drawings_revision_idx` ON `order_drawings` (`revision_id`);--> statement-breakpoint
CREATE INDEX `order_procedures_order_idx` ON `order_procedures` (`order_id`);--> statement-breakpoint
CREATE INDEX `procedures_shop_title_idx` ON `procedures` (`shop_id`,`title`);--> statement-breakpoint
CREATE INDEX `repair_order_units_unit_idx` ON `repair_order_units` (`unit_id`);--> statement-breakpoint
CREATE INDEX `repair_orders_shop_status_idx` ON `repair_orders` (`shop_id`,`status`);--> statement-breakpoint
CREATE INDEX `repair_orders_shop_tech_idx` ON `repair_orders` (`shop_id`,`assigned_tech_id`);--> statement-breakpoint
CREATE INDEX `repair_orders_shop_customer_idx` ON `repair_orders` (`shop_id`,`customer_id`);--> statement-breakpoint
CREATE INDEX `repair_orders_shop_opened_idx` ON `repair_orders` (`shop_id`,`opened_at`);--> statement-breakpoint
CREATE INDEX `report_sends_order_idx` ON `report_sends` (`order_id`,`sent_at`);--> statement-breakpoint
CREATE INDEX `time_entries_order_idx` ON `time_entries` (`order_id`,`kind`);--> statement-breakpoint
CREATE INDEX `time_entries_shop_tech_idx` ON `time_entries` (`shop_id`,`tech_id`,`work_date`);--> statement-breakpoint
CREATE INDEX `units_shop_customer_idx` ON `units` (`shop_id`,`customer_id`);--> statement-breakpoint
CREATE INDEX `units_shop_serial_idx` ON `units` (`shop_id`,`serial_number`);