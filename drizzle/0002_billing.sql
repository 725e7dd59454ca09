CREATE TABLE `credit_ledger` (
	`id` text PRIMARY KEY NOT NULL,
	`studio_id` text NOT NULL,
	`kind` text NOT NULL,
	`amount` integer NOT NULL,
	`period` text,
	`pool` text NOT NULL,
	`purchase_id` text,
	`take_id` text,
	`detail` text DEFAULT '' NOT NULL,
	`created_by_user_id` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`studio_id`) REFERENCES `studio`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`purchase_id`) REFERENCES `purchase`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`created_by_user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `credit_ledger_studio_idx` ON `credit_ledger` (`studio_id`,`created_at`);--> statement-breakpoint
CREATE UNIQUE INDEX `credit_ledger_grant_uq` ON `credit_ledger` (`studio_id`,`period`) WHERE kind = 'grant';--> statement-breakpoint
CREATE UNIQUE INDEX `credit_ledger_purchase_uq` ON `credit_ledger` (`purchase_id`) WHERE kind = 'purchase';--> statement-breakpoint
CREATE TABLE `purchase` (
	`id` text PRIMARY KEY NOT NULL,
	`studio_id` text NOT NULL,
	`pack` text NOT NULL,
	`credits` integer NOT NULL,
	`amount_cents` integer NOT NULL,
	`currency` text NOT NULL,
	`stripe_session_id` text,
	`state` text DEFAULT 'pending' NOT NULL,
	`created_by_user_id` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	`paid_at` integer,
	FOREIGN KEY (`studio_id`) REFERENCES `studio`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by_user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `purchase_stripe_session_id_unique` ON `purchase` (`stripe_session_id`);--> statement-breakpoint
CREATE INDEX `purchase_studio_idx` ON `purchase` (`studio_id`);--> statement-breakpoint
CREATE TABLE `stripe_event` (
	`id` text PRIMARY KEY NOT NULL,
	`type` text NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL
);
