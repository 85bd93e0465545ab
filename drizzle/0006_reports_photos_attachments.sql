CREATE TABLE `job_report_sendings` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organisation_id` integer NOT NULL,
	`job_id` integer NOT NULL,
	`report_id` integer,
	`to` text NOT NULL,
	`message_id` text,
	`sent_by_id` integer NOT NULL,
	`sent_at` integer NOT NULL,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`job_id`) REFERENCES `jobs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`report_id`) REFERENCES `job_reports`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`sent_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `job_report_sendings_job_id_idx` ON `job_report_sendings` (`job_id`);--> statement-breakpoint
CREATE TABLE `job_reports` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organisation_id` integer NOT NULL,
	`job_id` integer NOT NULL,
	`revision` integer NOT NULL,
	`job_version` integer NOT NULL,
	`source_sha256` text NOT NULL,
	`signer_name` text NOT NULL,
	`signature_png` blob NOT NULL,
	`pdf` blob NOT NULL,
	`pdf_sha256` text NOT NULL,
	`signed_by_id` integer NOT NULL,
	`signed_at` integer NOT NULL,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`job_id`) REFERENCES `jobs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`signed_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `job_reports_job_revision_idx` ON `job_reports` (`job_id`,`revision`);--> statement-breakpoint
CREATE TABLE `mail_attachments` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`message_id` integer NOT NULL,
	`filename` text NOT NULL,
	`content_type` text NOT NULL,
	`byte_size` integer NOT NULL,
	`content` blob NOT NULL,
	FOREIGN KEY (`message_id`) REFERENCES `mail_messages`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `mail_attachments_message_id_idx` ON `mail_attachments` (`message_id`);--> statement-breakpoint
CREATE TABLE `photos` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organisation_id` integer NOT NULL,
	`machine_id` integer,
	`job_id` integer,
	`sha256` text NOT NULL,
	`thumbnail_sha256` text NOT NULL,
	`media_type` text NOT NULL,
	`width_px` integer NOT NULL,
	`height_px` integer NOT NULL,
	`byte_size` integer NOT NULL,
	`caption` text,
	`calibration` text,
	`overlay_background` integer DEFAULT false NOT NULL,
	`created_by_id` integer NOT NULL,
	`created_at` integer NOT NULL,
	`removed_at` integer,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`machine_id`) REFERENCES `machines`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`job_id`) REFERENCES `jobs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "photos_machine_or_job" CHECK(("photos"."machine_id" is null) <> ("photos"."job_id" is null))
);
--> statement-breakpoint
CREATE INDEX `photos_machine_id_idx` ON `photos` (`machine_id`);--> statement-breakpoint
CREATE INDEX `photos_job_id_idx` ON `photos` (`job_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `photos_machine_overlay_idx` ON `photos` (`machine_id`) WHERE "photos"."overlay_background" = 1 and "photos"."removed_at" is null;