-- The regional engine's summary of published reports: one row per tree, variety, place and growing
-- form, with the tree's report and ripened counts, its breba counts, and the main crop's first-ripe
-- days of year and days from spring frost to first ripe fig (comma-separated lists, so medians stay
-- exact), and each report's own frost-free season as 'season:days'. A radius query reads these rows
-- (about a third as many as reports) through their own R*Tree instead of every report.
-- Triggers on reports rebuild a tree's rows whenever one of its reports changes, so the table never
-- disagrees with the reports it sums (tests compare it with the pure grouping in shared/domain).
CREATE TABLE `tree_evidence` (
  `id` integer PRIMARY KEY NOT NULL,
  `tree_id` integer NOT NULL,
  `user_id` integer NOT NULL,
  `variety_id` integer NOT NULL,
  `lat` real NOT NULL,
  `lon` real NOT NULL,
  `form` text NOT NULL,
  `reports` integer NOT NULL,
  `ripened` integer NOT NULL,
  `breba_reports` integer NOT NULL,
  `breba_ripened` integer NOT NULL,
  `first_ripe_doys` text,
  `frost_to_ripe_days` text,
  `frost_seasons` text
);
--> statement-breakpoint
CREATE INDEX `tree_evidence_tree_idx` ON `tree_evidence` (`tree_id`);
--> statement-breakpoint
CREATE INDEX `tree_evidence_variety_idx` ON `tree_evidence` (`variety_id`);
--> statement-breakpoint
CREATE VIRTUAL TABLE `tree_evidence_rtree` USING rtree(`id`, `min_lat`, `max_lat`, `min_lon`, `max_lon`);
--> statement-breakpoint
CREATE TRIGGER `tree_evidence_rtree_insert` AFTER INSERT ON `tree_evidence` BEGIN
  INSERT INTO `tree_evidence_rtree` VALUES (NEW.`id`, NEW.`lat`, NEW.`lat`, NEW.`lon`, NEW.`lon`);
END;
--> statement-breakpoint
CREATE TRIGGER `tree_evidence_rtree_delete` AFTER DELETE ON `tree_evidence` BEGIN
  DELETE FROM `tree_evidence_rtree` WHERE `id` = OLD.`id`;
END;
--> statement-breakpoint
-- The view that defines a tree's rows; the triggers and the first fill below read it.
CREATE VIEW `tree_evidence_source` AS
SELECT `tree_id`, `user_id`, `variety_id`, `lat`, `lon`, `form`,
       count(*) AS `reports`,
       sum(`outcome` = 'ripened') AS `ripened`,
       sum(`crop` = 'breba') AS `breba_reports`,
       sum(`crop` = 'breba' AND `outcome` = 'ripened') AS `breba_ripened`,
       group_concat(CASE WHEN `crop` = 'main' THEN CAST(strftime('%j', `first_ripe_date`) AS integer) END) AS `first_ripe_doys`,
       group_concat(CASE WHEN `crop` = 'main' AND `first_ripe_date` IS NOT NULL AND `spring_frost_date` IS NOT NULL THEN
         CAST(strftime('%j', `first_ripe_date`) AS integer) - CAST(strftime('%j', `spring_frost_date`) AS integer)
         + CASE WHEN strftime('%j', `first_ripe_date`) < strftime('%j', `spring_frost_date`) THEN 365 ELSE 0 END END) AS `frost_to_ripe_days`,
       group_concat(CASE WHEN `spring_frost_date` IS NOT NULL AND `fall_frost_date` IS NOT NULL THEN
         `season` || ':' || CAST(julianday(`fall_frost_date`) - julianday(`spring_frost_date`) - 1 AS integer) END) AS `frost_seasons`
  FROM `reports`
 WHERE `status` = 'published' AND `variety_id` IS NOT NULL
 GROUP BY `tree_id`, `user_id`, `variety_id`, `lat`, `lon`, `form`;
--> statement-breakpoint
CREATE TRIGGER `reports_tree_evidence_insert` AFTER INSERT ON `reports` WHEN NEW.`status` = 'published' BEGIN
  DELETE FROM `tree_evidence` WHERE `tree_id` = NEW.`tree_id`;
  INSERT INTO `tree_evidence` (`tree_id`, `user_id`, `variety_id`, `lat`, `lon`, `form`, `reports`, `ripened`, `breba_reports`, `breba_ripened`, `first_ripe_doys`, `frost_to_ripe_days`, `frost_seasons`)
    SELECT * FROM `tree_evidence_source` WHERE `tree_id` = NEW.`tree_id`;
END;
--> statement-breakpoint
CREATE TRIGGER `reports_tree_evidence_update` AFTER UPDATE OF `tree_id`, `user_id`, `variety_id`, `lat`, `lon`, `form`, `season`, `crop`, `outcome`, `first_ripe_date`, `spring_frost_date`, `fall_frost_date`, `status` ON `reports`
  WHEN OLD.`status` = 'published' OR NEW.`status` = 'published' BEGIN
  DELETE FROM `tree_evidence` WHERE `tree_id` = NEW.`tree_id`;
  INSERT INTO `tree_evidence` (`tree_id`, `user_id`, `variety_id`, `lat`, `lon`, `form`, `reports`, `ripened`, `breba_reports`, `breba_ripened`, `first_ripe_doys`, `frost_to_ripe_days`, `frost_seasons`)
    SELECT * FROM `tree_evidence_source` WHERE `tree_id` = NEW.`tree_id`;
END;
--> statement-breakpoint
-- A report moved to another tree also leaves its old tree's rows to rebuild.
CREATE TRIGGER `reports_tree_evidence_update_old_tree` AFTER UPDATE OF `tree_id` ON `reports`
  WHEN OLD.`tree_id` <> NEW.`tree_id` AND OLD.`status` = 'published' BEGIN
  DELETE FROM `tree_evidence` WHERE `tree_id` = OLD.`tree_id`;
  INSERT INTO `tree_evidence` (`tree_id`, `user_id`, `variety_id`, `lat`, `lon`, `form`, `reports`, `ripened`, `breba_reports`, `breba_ripened`, `first_ripe_doys`, `frost_to_ripe_days`, `frost_seasons`)
    SELECT * FROM `tree_evidence_source` WHERE `tree_id` = OLD.`tree_id`;
END;
--> statement-breakpoint
CREATE TRIGGER `reports_tree_evidence_delete` AFTER DELETE ON `reports` WHEN OLD.`status` = 'published' BEGIN
  DELETE FROM `tree_evidence` WHERE `tree_id` = OLD.`tree_id`;
  INSERT INTO `tree_evidence` (`tree_id`, `user_id`, `variety_id`, `lat`, `lon`, `form`, `reports`, `ripened`, `breba_reports`, `breba_ripened`, `first_ripe_doys`, `frost_to_ripe_days`, `frost_seasons`)
    SELECT * FROM `tree_evidence_source` WHERE `tree_id` = OLD.`tree_id`;
END;
--> statement-breakpoint
INSERT INTO `tree_evidence` (`tree_id`, `user_id`, `variety_id`, `lat`, `lon`, `form`, `reports`, `ripened`, `breba_reports`, `breba_ripened`, `first_ripe_doys`, `frost_to_ripe_days`, `frost_seasons`)
  SELECT * FROM `tree_evidence_source`;
