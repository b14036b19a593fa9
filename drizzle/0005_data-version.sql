-- O(1) data versions for in-memory caches (hand-written; drizzle-kit does not model triggers).
-- `data_versions` holds one counter per named data set. The row 'atlas' moves on every insert,
-- update or delete of a report or a variety, whichever connection commits it, so a cache of
-- anything computed from reports and varieties (map pins, variety rates) can tell in one indexed
-- read whether it is still current. Read it with `atlasDataVersion(db)` in server/db/data-version.ts.
CREATE TABLE `data_versions` (
	`name` text PRIMARY KEY NOT NULL,
	`version` integer DEFAULT 0 NOT NULL
) WITHOUT ROWID;
--> statement-breakpoint
INSERT INTO `data_versions` (`name`, `version`) VALUES ('atlas', 0);
--> statement-breakpoint
CREATE TRIGGER `reports_atlas_version_insert` AFTER INSERT ON `reports` BEGIN
  UPDATE `data_versions` SET `version` = `version` + 1 WHERE `name` = 'atlas';
END;
--> statement-breakpoint
CREATE TRIGGER `reports_atlas_version_update` AFTER UPDATE ON `reports` BEGIN
  UPDATE `data_versions` SET `version` = `version` + 1 WHERE `name` = 'atlas';
END;
--> statement-breakpoint
CREATE TRIGGER `reports_atlas_version_delete` AFTER DELETE ON `reports` BEGIN
  UPDATE `data_versions` SET `version` = `version` + 1 WHERE `name` = 'atlas';
END;
--> statement-breakpoint
CREATE TRIGGER `varieties_atlas_version_insert` AFTER INSERT ON `varieties` BEGIN
  UPDATE `data_versions` SET `version` = `version` + 1 WHERE `name` = 'atlas';
END;
--> statement-breakpoint
CREATE TRIGGER `varieties_atlas_version_update` AFTER UPDATE ON `varieties` BEGIN
  UPDATE `data_versions` SET `version` = `version` + 1 WHERE `name` = 'atlas';
END;
--> statement-breakpoint
CREATE TRIGGER `varieties_atlas_version_delete` AFTER DELETE ON `varieties` BEGIN
  UPDATE `data_versions` SET `version` = `version` + 1 WHERE `name` = 'atlas';
END;
