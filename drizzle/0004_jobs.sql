CREATE TABLE `job_corrections` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organisation_id` integer NOT NULL,
	`job_id` integer NOT NULL,
	`sequence` integer NOT NULL,
	`method` text NOT NULL,
	`basis` text NOT NULL,
	`run_ids` text NOT NULL,
	`calc` text NOT NULL,
	`result` text NOT NULL,
	`plan` text NOT NULL,
	`installed` text,
	`predicted` text,
	`installed_at` integer,
	`warnings` text NOT NULL,
	`created_by_id` integer NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`job_id`) REFERENCES `jobs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `job_corrections_job_sequence_idx` ON `job_corrections` (`job_id`,`sequence`);--> statement-breakpoint
CREATE TABLE `job_runs` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organisation_id` integer NOT NULL,
	`job_id` integer NOT NULL,
	`sequence` integer NOT NULL,
	`kind` text NOT NULL,
	`trial_weight` text,
	`weights_on_rotor` text NOT NULL,
	`readings` text NOT NULL,
	`warnings` text NOT NULL,
	`created_by_id` integer NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`job_id`) REFERENCES `jobs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `job_runs_job_sequence_idx` ON `job_runs` (`job_id`,`sequence`);--> statement-breakpoint
CREATE TABLE `jobs` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organisation_id` integer NOT NULL,
	`machine_id` integer NOT NULL,
	`technician_id` integer NOT NULL,
	`scheduled_for` text NOT NULL,
	`status` text NOT NULL,
	`safety` text,
	`inspection` text,
	`setup` text,
	`completion` text,
	`abandonment` text,
	`version` integer NOT NULL,
	`created_by_id` integer NOT NULL,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`machine_id`) REFERENCES `machines`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`technician_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "jobs_version_positive" CHECK("jobs"."version" > 0)
);
--> statement-breakpoint
CREATE INDEX `jobs_organisation_scheduled_idx` ON `jobs` (`organisation_id`,`scheduled_for`);--> statement-breakpoint
CREATE INDEX `jobs_organisation_technician_idx` ON `jobs` (`organisation_id`,`technician_id`);--> statement-breakpoint
CREATE INDEX `jobs_machine_id_idx` ON `jobs` (`machine_id`);