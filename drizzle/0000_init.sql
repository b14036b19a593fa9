CREATE TABLE `audit_log` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`actor_id` integer,
	`action` text NOT NULL,
	`entity_type` text NOT NULL,
	`entity_id` integer,
	`before` text,
	`after` text,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	FOREIGN KEY (`actor_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `audit_log_entity_idx` ON `audit_log` (`entity_type`,`entity_id`);--> statement-breakpoint
CREATE INDEX `audit_log_created_idx` ON `audit_log` (`created_at`);--> statement-breakpoint
CREATE TABLE `rate_limit_hits` (
	`key` text PRIMARY KEY NOT NULL,
	`hits` integer NOT NULL,
	`reset_at` integer NOT NULL
);
--> statement-breakpoint
CREATE TABLE `report_flags` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`report_id` integer NOT NULL,
	`user_id` integer NOT NULL,
	`reason` text NOT NULL,
	`status` text DEFAULT 'open' NOT NULL,
	`resolved_by_id` integer,
	`resolved_at` text,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	FOREIGN KEY (`report_id`) REFERENCES `reports`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`resolved_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `report_flags_status_idx` ON `report_flags` (`status`);--> statement-breakpoint
CREATE INDEX `report_flags_report_idx` ON `report_flags` (`report_id`);--> statement-breakpoint
CREATE TABLE `report_photos` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`report_id` integer NOT NULL,
	`file_name` text NOT NULL,
	`thumb_name` text NOT NULL,
	`mime` text NOT NULL,
	`width` integer NOT NULL,
	`height` integer NOT NULL,
	`bytes` integer NOT NULL,
	`position` integer DEFAULT 0 NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	FOREIGN KEY (`report_id`) REFERENCES `reports`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `report_photos_report_idx` ON `report_photos` (`report_id`);--> statement-breakpoint
CREATE TABLE `reports` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`user_id` integer NOT NULL,
	`tree_id` integer NOT NULL,
	`variety_id` integer,
	`proposed_variety_name` text,
	`lat` real NOT NULL,
	`lon` real NOT NULL,
	`grid_lat` real NOT NULL,
	`grid_lon` real NOT NULL,
	`form` text NOT NULL,
	`origin` text DEFAULT 'unknown' NOT NULL,
	`year_planted` integer,
	`season` integer NOT NULL,
	`crop` text NOT NULL,
	`outcome` text NOT NULL,
	`first_ripe_date` text,
	`last_harvest_date` text,
	`spring_frost_date` text,
	`fall_frost_date` text,
	`pinched` integer DEFAULT false NOT NULL,
	`pinched_date` text,
	`winter_protection` text DEFAULT '' NOT NULL,
	`feeding` text DEFAULT '' NOT NULL,
	`watering` text DEFAULT '' NOT NULL,
	`notes` text DEFAULT '' NOT NULL,
	`status` text DEFAULT 'published' NOT NULL,
	`hidden_reason` text,
	`hidden_by_id` integer,
	`hidden_at` text,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	`updated_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	`updated_by_id` integer,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`tree_id`) REFERENCES `trees`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`variety_id`) REFERENCES `varieties`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`hidden_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`updated_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `reports_user_idx` ON `reports` (`user_id`);--> statement-breakpoint
CREATE INDEX `reports_tree_idx` ON `reports` (`tree_id`);--> statement-breakpoint
CREATE INDEX `reports_variety_idx` ON `reports` (`variety_id`);--> statement-breakpoint
CREATE INDEX `reports_status_created_idx` ON `reports` (`status`,`created_at`);--> statement-breakpoint
CREATE INDEX `reports_grid_idx` ON `reports` (`grid_lat`,`grid_lon`);--> statement-breakpoint
CREATE TABLE `saved_places` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`user_id` integer NOT NULL,
	`name` text NOT NULL,
	`lat` real NOT NULL,
	`lon` real NOT NULL,
	`form` text DEFAULT 'ground' NOT NULL,
	`is_home` integer DEFAULT false NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `saved_places_user_idx` ON `saved_places` (`user_id`);--> statement-breakpoint
CREATE TABLE `sessions` (
	`sid` text PRIMARY KEY NOT NULL,
	`data` text NOT NULL,
	`user_id` integer,
	`expires_at` integer NOT NULL
);
--> statement-breakpoint
CREATE INDEX `sessions_expires_idx` ON `sessions` (`expires_at`);--> statement-breakpoint
CREATE INDEX `sessions_user_idx` ON `sessions` (`user_id`);--> statement-breakpoint
CREATE TABLE `station_days` (
	`station_id` integer NOT NULL,
	`date` text NOT NULL,
	`tmin_c` real NOT NULL,
	`tmax_c` real,
	PRIMARY KEY(`station_id`, `date`),
	FOREIGN KEY (`station_id`) REFERENCES `stations`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `station_freeze_years` (
	`station_id` integer NOT NULL,
	`threshold_f` integer NOT NULL,
	`year` integer NOT NULL,
	`last_spring_doy` integer,
	`first_fall_doy` integer,
	`season_days` integer,
	PRIMARY KEY(`station_id`, `threshold_f`, `year`),
	FOREIGN KEY (`station_id`) REFERENCES `stations`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `station_summaries` (
	`station_id` integer NOT NULL,
	`threshold_f` integer NOT NULL,
	`probability` integer NOT NULL,
	`last_spring_doy` integer,
	`first_fall_doy` integer,
	`season_days` integer,
	`years` integer NOT NULL,
	PRIMARY KEY(`station_id`, `threshold_f`, `probability`),
	FOREIGN KEY (`station_id`) REFERENCES `stations`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `stations` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`code` text,
	`name` text NOT NULL,
	`lat` real NOT NULL,
	`lon` real NOT NULL,
	`elevation_m` real,
	`first_date` text,
	`last_date` text,
	`day_count` integer DEFAULT 0 NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	`updated_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `stations_code_unique` ON `stations` (`code`);--> statement-breakpoint
CREATE TABLE `trees` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`user_id` integer NOT NULL,
	`label` text NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `trees_user_idx` ON `trees` (`user_id`);--> statement-breakpoint
CREATE TABLE `users` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`email` text NOT NULL,
	`display_name` text NOT NULL,
	`password_hash` text NOT NULL,
	`role` text DEFAULT 'grower' NOT NULL,
	`email_verified_at` text,
	`is_demo` integer DEFAULT false NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	`updated_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `users_email_unique` ON `users` (`email`);--> statement-breakpoint
CREATE TABLE `varieties` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`name` text NOT NULL,
	`fig_type` text DEFAULT 'unknown' NOT NULL,
	`bears_breba` integer DEFAULT false NOT NULL,
	`bears_main` integer DEFAULT true NOT NULL,
	`ripening_class` text,
	`typical_days_to_ripen` integer,
	`notes` text DEFAULT '' NOT NULL,
	`sources` text DEFAULT '' NOT NULL,
	`status` text DEFAULT 'accepted' NOT NULL,
	`proposed_by_user_id` integer,
	`review_note` text,
	`merged_into_id` integer,
	`is_fictional` integer DEFAULT false NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	`updated_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	FOREIGN KEY (`proposed_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `varieties_name_idx` ON `varieties` (lower("name"));--> statement-breakpoint
CREATE INDEX `varieties_status_idx` ON `varieties` (`status`);--> statement-breakpoint
CREATE TABLE `variety_synonyms` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`variety_id` integer NOT NULL,
	`name` text NOT NULL,
	FOREIGN KEY (`variety_id`) REFERENCES `varieties`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `variety_synonyms_name_idx` ON `variety_synonyms` (lower("name"));--> statement-breakpoint
CREATE INDEX `variety_synonyms_variety_idx` ON `variety_synonyms` (`variety_id`);--> statement-breakpoint
CREATE TABLE `wasp_areas` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`name` text NOT NULL,
	`geometry` text NOT NULL,
	`min_lat` real NOT NULL,
	`max_lat` real NOT NULL,
	`min_lon` real NOT NULL,
	`max_lon` real NOT NULL,
	`source` text NOT NULL,
	`observed_on` text NOT NULL,
	`status` text DEFAULT 'active' NOT NULL,
	`retired_at` text,
	`created_by_id` integer,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	`updated_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `wasp_areas_status_idx` ON `wasp_areas` (`status`);