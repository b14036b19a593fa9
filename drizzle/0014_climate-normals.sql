-- Reference climate (issue 21): NOAA NCEI climate normals, kept apart from the stations computed
-- from daily records. One row per normals station (its GHCN id), tagged with the release it comes
-- from; a newer release replaces a station's row (server/normals/normals.repo.ts). Its triggers move
-- the 'stations' data version, so the in-memory station snapshot re-reads them.
CREATE TABLE `normals_releases` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`name` text NOT NULL,
	`period_start` integer NOT NULL,
	`period_end` integer NOT NULL,
	`source` text NOT NULL,
	`fingerprint` text,
	`station_count` integer DEFAULT 0 NOT NULL,
	`loaded_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `normals_releases_name_unique` ON `normals_releases` (`name`);
--> statement-breakpoint
CREATE TABLE `normals_stations` (
	`code` text PRIMARY KEY NOT NULL,
	`release_id` integer NOT NULL REFERENCES `normals_releases`(`id`) ON DELETE CASCADE,
	`name` text NOT NULL,
	`state` text,
	`lat` real NOT NULL,
	`lon` real NOT NULL,
	`elevation_m` real,
	`last_spring_doy50` integer,
	`last_spring_doy90` integer,
	`first_fall_doy50` integer,
	`first_fall_doy90` integer,
	`season_days50` integer,
	`season_days90` integer,
	`freeze_note` text,
	`gdd50_f` real,
	`flag` text
);
--> statement-breakpoint
CREATE INDEX `normals_stations_release_idx` ON `normals_stations` (`release_id`);
--> statement-breakpoint
CREATE TRIGGER `normals_stations_stations_version_insert` AFTER INSERT ON `normals_stations` BEGIN
  UPDATE `data_versions` SET `version` = `version` + 1 WHERE `name` = 'stations';
END;
--> statement-breakpoint
CREATE TRIGGER `normals_stations_stations_version_update` AFTER UPDATE ON `normals_stations` BEGIN
  UPDATE `data_versions` SET `version` = `version` + 1 WHERE `name` = 'stations';
END;
--> statement-breakpoint
CREATE TRIGGER `normals_stations_stations_version_delete` AFTER DELETE ON `normals_stations` BEGIN
  UPDATE `data_versions` SET `version` = `version` + 1 WHERE `name` = 'stations';
END;
--> statement-breakpoint
-- Heat and winter cold from a station's own daily record (issue 16): the mean yearly growing degree
-- days base 50 F over years with maxima and minima, and the average annual extreme minimum.
ALTER TABLE `stations` ADD `gdd50_f` real;
--> statement-breakpoint
ALTER TABLE `stations` ADD `gdd_years` integer DEFAULT 0 NOT NULL;
--> statement-breakpoint
ALTER TABLE `stations` ADD `extreme_min_c` real;
--> statement-breakpoint
ALTER TABLE `stations` ADD `extreme_min_winters` integer DEFAULT 0 NOT NULL;
--> statement-breakpoint
-- Years left out of the summaries for missing days are kept with the reason (issue 16 item 5).
ALTER TABLE `station_freeze_years` ADD `left_out_reason` text;
