-- The grower's units and date language (issue 18 item 3): null until they choose, the browser's
-- language decides meanwhile. The API stays in SI and ISO dates; these only steer what is shown
-- and what the e-mails say.
ALTER TABLE `users` ADD `temperature_unit` text;
--> statement-breakpoint
ALTER TABLE `users` ADD `distance_unit` text;
--> statement-breakpoint
ALTER TABLE `users` ADD `date_locale` text;
--> statement-breakpoint
-- Varieties and places a grower follows: their news goes into the weekly nearby digest.
CREATE TABLE `followed_varieties` (
	`user_id` integer NOT NULL,
	`variety_id` integer NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	PRIMARY KEY(`user_id`, `variety_id`),
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`variety_id`) REFERENCES `varieties`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `followed_varieties_variety_idx` ON `followed_varieties` (`variety_id`);
--> statement-breakpoint
CREATE TABLE `followed_places` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`user_id` integer NOT NULL,
	`name` text NOT NULL,
	`lat` real NOT NULL,
	`lon` real NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `followed_places_user_idx` ON `followed_places` (`user_id`);
