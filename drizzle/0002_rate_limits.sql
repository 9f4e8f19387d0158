CREATE TABLE `rate_limits` (
	`key_hash` char(64) NOT NULL,
	`hits` int NOT NULL,
	`reset_at` datetime(3) NOT NULL,
	CONSTRAINT `rate_limits_key_hash` PRIMARY KEY(`key_hash`)
);
--> statement-breakpoint
CREATE INDEX `rate_limits_reset_idx` ON `rate_limits` (`reset_at`);