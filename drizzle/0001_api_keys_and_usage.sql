CREATE TABLE `api_keys` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`name` text NOT NULL,
	`prefix` text NOT NULL,
	`hash` text NOT NULL,
	`limit_per_minute` integer NOT NULL,
	`created_at` integer NOT NULL,
	`last_used_at` integer,
	`revoked_at` integer,
	CONSTRAINT "api_keys_limit_per_minute_positive" CHECK("api_keys"."limit_per_minute" > 0)
);
--> statement-breakpoint
CREATE UNIQUE INDEX `api_keys_hash_unique` ON `api_keys` (`hash`);--> statement-breakpoint
CREATE TABLE `api_usage` (
	`id` integer PRIMARY KEY NOT NULL,
	`key_id` integer NOT NULL,
	`route` text NOT NULL,
	`status` integer NOT NULL,
	`duration_ms` real NOT NULL,
	`bytes` integer NOT NULL,
	`at` integer NOT NULL,
	FOREIGN KEY (`key_id`) REFERENCES `api_keys`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `api_usage_key_id_at_idx` ON `api_usage` (`key_id`,`at`);