-- Supporters (issue 20): memberships and contributions follow the payment provider's signed events;
-- payment_events makes each event count once. No card data is ever stored.
ALTER TABLE `users` ADD `supporter_mark` integer DEFAULT false NOT NULL;
--> statement-breakpoint
CREATE TABLE `memberships` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`user_id` integer NOT NULL REFERENCES `users`(`id`) ON DELETE cascade,
	`provider_subscription_id` text NOT NULL,
	`tier` text NOT NULL,
	`amount_minor` integer NOT NULL,
	`currency` text NOT NULL,
	`status` text NOT NULL,
	`started_at` text NOT NULL,
	`renews_on` text,
	`cancelled_at` text,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	`updated_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `memberships_subscription_unique` ON `memberships` (`provider_subscription_id`);
--> statement-breakpoint
CREATE INDEX `memberships_user_idx` ON `memberships` (`user_id`);
--> statement-breakpoint
CREATE TABLE `contributions` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`user_id` integer REFERENCES `users`(`id`) ON DELETE set null,
	`kind` text NOT NULL,
	`provider_ref` text NOT NULL,
	`amount_minor` integer NOT NULL,
	`currency` text NOT NULL,
	`paid_at` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `contributions_provider_ref_unique` ON `contributions` (`provider_ref`);
--> statement-breakpoint
CREATE TABLE `checkout_attempts` (
	`session_id` text PRIMARY KEY NOT NULL,
	`user_id` integer REFERENCES `users`(`id`) ON DELETE set null,
	`kind` text NOT NULL,
	`tier` text,
	`amount_minor` integer NOT NULL,
	`currency` text NOT NULL,
	`state` text DEFAULT 'waiting' NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL
);
--> statement-breakpoint
CREATE TABLE `payment_events` (
	`event_id` text PRIMARY KEY NOT NULL,
	`type` text NOT NULL,
	`received_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL
);
--> statement-breakpoint
CREATE TABLE `dev_payment_objects` (
	`id` text PRIMARY KEY NOT NULL,
	`kind` text NOT NULL,
	`data` text NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL
);
