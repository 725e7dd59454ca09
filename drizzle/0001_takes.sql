CREATE TABLE `analysis` (
	`id` text PRIMARY KEY NOT NULL,
	`take_id` text NOT NULL,
	`studio_id` text NOT NULL,
	`state` text DEFAULT 'queued' NOT NULL,
	`progress_percent` real DEFAULT 0 NOT NULL,
	`settings_json` text DEFAULT '{}' NOT NULL,
	`error` text,
	`attempts` integer DEFAULT 0 NOT NULL,
	`cancel_requested` integer DEFAULT false NOT NULL,
	`worker_id` text,
	`lease_until` integer,
	`created_by_user_id` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	`started_at` integer,
	`finished_at` integer,
	FOREIGN KEY (`take_id`) REFERENCES `take`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`studio_id`) REFERENCES `studio`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by_user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `analysis_take_idx` ON `analysis` (`take_id`);--> statement-breakpoint
CREATE INDEX `analysis_state_idx` ON `analysis` (`state`,`created_at`);--> statement-breakpoint
CREATE TABLE `api_key` (
	`id` text PRIMARY KEY NOT NULL,
	`studio_id` text NOT NULL,
	`name` text NOT NULL,
	`prefix` text NOT NULL,
	`key_hash` text NOT NULL,
	`role` text NOT NULL,
	`created_by_user_id` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	`last_used_at` integer,
	`revoked_at` integer,
	FOREIGN KEY (`studio_id`) REFERENCES `studio`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by_user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `api_key_key_hash_unique` ON `api_key` (`key_hash`);--> statement-breakpoint
CREATE INDEX `api_key_studio_idx` ON `api_key` (`studio_id`);--> statement-breakpoint
CREATE TABLE `draft` (
	`analysis_id` text PRIMARY KEY NOT NULL,
	`take_id` text NOT NULL,
	`reference_hz` real NOT NULL,
	`notes_json` text NOT NULL,
	`note_count` integer NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`analysis_id`) REFERENCES `analysis`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`take_id`) REFERENCES `take`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `revision` (
	`id` text PRIMARY KEY NOT NULL,
	`take_id` text NOT NULL,
	`number` integer NOT NULL,
	`reference_hz` real NOT NULL,
	`notes_json` text NOT NULL,
	`note_count` integer NOT NULL,
	`created_by_user_id` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`take_id`) REFERENCES `take`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by_user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `revision_take_number_uq` ON `revision` (`take_id`,`number`);--> statement-breakpoint
CREATE TABLE `take` (
	`id` text PRIMARY KEY NOT NULL,
	`studio_id` text NOT NULL,
	`project_id` text NOT NULL,
	`name` text NOT NULL,
	`original_key` text NOT NULL,
	`original_mime` text NOT NULL,
	`original_bytes` integer NOT NULL,
	`original_sha256` text NOT NULL,
	`analysis_key` text NOT NULL,
	`duration_sec` real NOT NULL,
	`sample_rate_hz` integer NOT NULL,
	`channels` integer NOT NULL,
	`created_by_user_id` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`studio_id`) REFERENCES `studio`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`project_id`) REFERENCES `project`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by_user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `take_project_idx` ON `take` (`project_id`);--> statement-breakpoint
CREATE INDEX `take_studio_idx` ON `take` (`studio_id`);