CREATE TABLE `customers` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organisation_id` integer NOT NULL,
	`name` text NOT NULL,
	`email` text,
	`phone` text,
	`site_address` text,
	`notes` text,
	`contacts` text NOT NULL,
	`name_key` text NOT NULL,
	`search_text` text NOT NULL,
	`version` integer NOT NULL,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	`archived_at` integer,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "customers_version_positive" CHECK("customers"."version" > 0)
);
--> statement-breakpoint
CREATE INDEX `customers_organisation_name_idx` ON `customers` (`organisation_id`,`name_key`);--> statement-breakpoint
CREATE INDEX `customers_organisation_updated_idx` ON `customers` (`organisation_id`,`updated_at`);--> statement-breakpoint
CREATE INDEX `customers_organisation_created_idx` ON `customers` (`organisation_id`,`created_at`);--> statement-breakpoint
CREATE TABLE `machine_families` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organisation_id` integer NOT NULL,
	`name` text NOT NULL,
	`rotor_type` text NOT NULL,
	`nominal_speed_rpm` real NOT NULL,
	`plane_count` integer NOT NULL,
	`correction_radii_mm` text NOT NULL,
	`inspection_limits` text NOT NULL,
	`acceptance` text NOT NULL,
	`sensitivities` text NOT NULL,
	`notes` text,
	`name_key` text NOT NULL,
	`version` integer NOT NULL,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	`archived_at` integer,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "machine_families_plane_count" CHECK("machine_families"."plane_count" IN (1, 2)),
	CONSTRAINT "machine_families_version_positive" CHECK("machine_families"."version" > 0)
);
--> statement-breakpoint
CREATE INDEX `machine_families_organisation_name_idx` ON `machine_families` (`organisation_id`,`name_key`);--> statement-breakpoint
CREATE INDEX `machine_families_organisation_rotor_type_idx` ON `machine_families` (`organisation_id`,`rotor_type`);--> statement-breakpoint
CREATE INDEX `machine_families_organisation_updated_idx` ON `machine_families` (`organisation_id`,`updated_at`);--> statement-breakpoint
CREATE TABLE `machines` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organisation_id` integer NOT NULL,
	`customer_id` integer NOT NULL,
	`family_id` integer,
	`make` text,
	`model` text,
	`serial_number` text,
	`hours` real,
	`rotor_mass_kg` real,
	`operating_speed_rpm` real,
	`sensor_sides` text NOT NULL,
	`rotation_seen_from_left` text NOT NULL,
	`planes` text NOT NULL,
	`stock_weights_grams` text NOT NULL,
	`acceptance` text,
	`notes` text,
	`make_key` text,
	`serial_key` text,
	`search_text` text NOT NULL,
	`version` integer NOT NULL,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	`archived_at` integer,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`customer_id`) REFERENCES `customers`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`family_id`) REFERENCES `machine_families`(`id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "machines_version_positive" CHECK("machines"."version" > 0)
);
--> statement-breakpoint
CREATE INDEX `machines_organisation_serial_idx` ON `machines` (`organisation_id`,`serial_key`);--> statement-breakpoint
CREATE INDEX `machines_organisation_make_idx` ON `machines` (`organisation_id`,`make_key`);--> statement-breakpoint
CREATE INDEX `machines_organisation_updated_idx` ON `machines` (`organisation_id`,`updated_at`);--> statement-breakpoint
CREATE INDEX `machines_customer_id_idx` ON `machines` (`customer_id`);--> statement-breakpoint
CREATE INDEX `machines_family_id_idx` ON `machines` (`family_id`);--> statement-breakpoint
CREATE TABLE `record_changes` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organisation_id` integer NOT NULL,
	`entity_kind` text NOT NULL,
	`entity_id` integer NOT NULL,
	`version` integer NOT NULL,
	`action` text NOT NULL,
	`user_id` integer NOT NULL,
	`at` integer NOT NULL,
	`fields` text NOT NULL,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `record_changes_entity_version_idx` ON `record_changes` (`organisation_id`,`entity_kind`,`entity_id`,`version`);