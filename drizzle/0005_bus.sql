CREATE TABLE `bus_captures` (
	`id` varchar(26) NOT NULL,
	`shop_id` varchar(26) NOT NULL,
	`harness_id` varchar(26) NOT NULL,
	`revision_id` varchar(26),
	`name` varchar(200) NOT NULL,
	`file_name` varchar(255) NOT NULL,
	`size_bytes` bigint NOT NULL,
	`lines` int NOT NULL,
	`frames` int NOT NULL,
	`bad_line_count` int NOT NULL,
	`identifier_count` int NOT NULL,
	`duration_s` double,
	`summary` longtext NOT NULL,
	`storage_key` varchar(200) NOT NULL,
	`uploaded_by` varchar(26),
	`uploaded_at` datetime(3) NOT NULL,
	CONSTRAINT `bus_captures_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `bus_captures` ADD CONSTRAINT `bus_captures_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `bus_captures` ADD CONSTRAINT `bus_captures_harness_id_harnesses_id_fk` FOREIGN KEY (`harness_id`) REFERENCES `harnesses`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `bus_captures` ADD CONSTRAINT `bus_captures_revision_id_revisions_id_fk` FOREIGN KEY (`revision_id`) REFERENCES `revisions`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `bus_captures` ADD CONSTRAINT `bus_captures_uploaded_by_users_id_fk` FOREIGN KEY (`uploaded_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `bus_captures_shop_harness_idx` ON `bus_captures` (`shop_id`,`harness_id`,`uploaded_at`);
