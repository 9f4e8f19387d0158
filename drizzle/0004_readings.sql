CREATE TABLE `connector_bookmarks` (
	`user_id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`harness_id` varchar(26) NOT NULL,
	`connector_id` varchar(32) NOT NULL,
	`pinned` boolean NOT NULL DEFAULT false,
	`opened_at` datetime(3),
	CONSTRAINT `connector_bookmarks_user_id_harness_id_connector_id_pk` PRIMARY KEY(`user_id`,`harness_id`,`connector_id`)
);
--> statement-breakpoint
CREATE TABLE `pin_tolerances` (
	`shop_id` varchar(26) NOT NULL,
	`harness_id` varchar(26) NOT NULL,
	`pin` varchar(49) NOT NULL,
	`below` double NOT NULL,
	`above` double NOT NULL,
	`set_by` varchar(26),
	`set_at` datetime(3) NOT NULL,
	CONSTRAINT `pin_tolerances_harness_id_pin_pk` PRIMARY KEY(`harness_id`,`pin`)
);
--> statement-breakpoint
CREATE TABLE `reading_sets` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`revision_id` varchar(26) NOT NULL,
	`harness_id` varchar(26) NOT NULL,
	`repair_order_id` varchar(26),
	`unit_id` varchar(26),
	`title` varchar(200),
	`observations` longtext NOT NULL,
	`marked` longtext NOT NULL,
	`suspects` longtext NOT NULL,
	`version` int NOT NULL DEFAULT 1,
	`taken_by` varchar(26),
	`taken_at` datetime(3) NOT NULL,
	`updated_at` datetime(3) NOT NULL,
	CONSTRAINT `reading_sets_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `connector_bookmarks` ADD CONSTRAINT `connector_bookmarks_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `connector_bookmarks` ADD CONSTRAINT `connector_bookmarks_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `connector_bookmarks` ADD CONSTRAINT `connector_bookmarks_harness_id_harnesses_id_fk` FOREIGN KEY (`harness_id`) REFERENCES `harnesses`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `pin_tolerances` ADD CONSTRAINT `pin_tolerances_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `pin_tolerances` ADD CONSTRAINT `pin_tolerances_harness_id_harnesses_id_fk` FOREIGN KEY (`harness_id`) REFERENCES `harnesses`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `pin_tolerances` ADD CONSTRAINT `pin_tolerances_set_by_users_id_fk` FOREIGN KEY (`set_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `reading_sets` ADD CONSTRAINT `reading_sets_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `reading_sets` ADD CONSTRAINT `reading_sets_revision_id_revisions_id_fk` FOREIGN KEY (`revision_id`) REFERENCES `revisions`(`id`) ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `reading_sets` ADD CONSTRAINT `reading_sets_harness_id_harnesses_id_fk` FOREIGN KEY (`harness_id`) REFERENCES `harnesses`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `reading_sets` ADD CONSTRAINT `reading_sets_repair_order_id_repair_orders_id_fk` FOREIGN KEY (`repair_order_id`) REFERENCES `repair_orders`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `reading_sets` ADD CONSTRAINT `reading_sets_unit_id_units_id_fk` FOREIGN KEY (`unit_id`) REFERENCES `units`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `reading_sets` ADD CONSTRAINT `reading_sets_taken_by_users_id_fk` FOREIGN KEY (`taken_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `connector_bookmarks_user_opened_idx` ON `connector_bookmarks` (`user_id`,`opened_at`);--> statement-breakpoint
CREATE INDEX `pin_tolerances_shop_idx` ON `pin_tolerances` (`shop_id`);--> statement-breakpoint
CREATE INDEX `reading_sets_shop_order_idx` ON `reading_sets` (`shop_id`,`repair_order_id`);--> statement-breakpoint
CREATE INDEX `reading_sets_shop_revision_idx` ON `reading_sets` (`shop_id`,`revision_id`);--> statement-breakpoint
CREATE INDEX `reading_sets_shop_taken_by_idx` ON `reading_sets` (`shop_id`,`taken_by`);