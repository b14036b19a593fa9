-- Public answers come from each report's public grid cell, never its exact place (issue 15):
-- tree_evidence, which GET /api/atlas/near, the variety fit and the season estimate's grower
-- frost seasons read (server/atlas/tree-snapshot.ts), now holds each tree's grid cell centre
-- (reports.grid_lat/grid_lon, shared/domain/public-grid.ts) instead of its exact lat/lon, and
-- groups a tree's reports by cell. Moving a report within its cell changes nothing here: the
-- triggers rebuild a tree's rows only when a column they read really changes (an edit that
-- rewrites every column, or moves the exact place inside the cell, leaves the rows and their ids
-- as they were). Ids still follow place (a 0.1-degree cell of the grid position, then a counter).
DROP TRIGGER `reports_tree_evidence_insert`;
--> statement-breakpoint
DROP TRIGGER `reports_tree_evidence_update`;
--> statement-breakpoint
DROP TRIGGER `reports_tree_evidence_update_old_tree`;
--> statement-breakpoint
DROP TRIGGER `reports_tree_evidence_delete`;
--> statement-breakpoint
DROP VIEW `tree_evidence_source`;
--> statement-breakpoint
DROP TABLE `tree_evidence`;
--> statement-breakpoint
CREATE TABLE `tree_evidence` (
  `id` integer PRIMARY KEY NOT NULL,
  `tree_id` integer NOT NULL,
  `user_id` integer NOT NULL,
  `variety_id` integer NOT NULL,
  `grid_lat` real NOT NULL,
  `grid_lon` real NOT NULL,
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
CREATE VIEW `tree_evidence_source` AS
SELECT (CAST((`grid_lat` + 90) * 10 AS integer) * 3601 + CAST((`grid_lon` + 180) * 10 AS integer)) * 1073741824 AS `cell_base`,
       `tree_id`, `user_id`, `variety_id`, `grid_lat`, `grid_lon`, `form`,
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
 GROUP BY `tree_id`, `user_id`, `variety_id`, `grid_lat`, `grid_lon`, `form`;
--> statement-breakpoint
CREATE TRIGGER `reports_tree_evidence_insert` AFTER INSERT ON `reports` WHEN NEW.`status` = 'published' BEGIN
  DELETE FROM `tree_evidence` WHERE `tree_id` = NEW.`tree_id`;
  INSERT INTO `tree_evidence` (`id`, `tree_id`, `user_id`, `variety_id`, `grid_lat`, `grid_lon`, `form`, `reports`, `ripened`, `breba_reports`, `breba_ripened`, `first_ripe_doys`, `frost_to_ripe_days`, `frost_seasons`)
    SELECT s.`cell_base` + ifnull((SELECT max(e.`id`) FROM `tree_evidence` e WHERE e.`id` BETWEEN s.`cell_base` AND s.`cell_base` + 1073741823) - s.`cell_base`, 0)
             + row_number() OVER (PARTITION BY s.`cell_base`),
           s.`tree_id`, s.`user_id`, s.`variety_id`, s.`grid_lat`, s.`grid_lon`, s.`form`, s.`reports`, s.`ripened`, s.`breba_reports`, s.`breba_ripened`,
           s.`first_ripe_doys`, s.`frost_to_ripe_days`, s.`frost_seasons`
      FROM `tree_evidence_source` s WHERE s.`tree_id` = NEW.`tree_id`;
END;
--> statement-breakpoint
CREATE TRIGGER `reports_tree_evidence_update` AFTER UPDATE OF `tree_id`, `user_id`, `variety_id`, `grid_lat`, `grid_lon`, `form`, `season`, `crop`, `outcome`, `first_ripe_date`, `spring_frost_date`, `fall_frost_date`, `status` ON `reports`
  WHEN (OLD.`status` = 'published' OR NEW.`status` = 'published')
   AND (OLD.`tree_id` IS NOT NEW.`tree_id` OR OLD.`user_id` IS NOT NEW.`user_id` OR OLD.`variety_id` IS NOT NEW.`variety_id` OR OLD.`grid_lat` IS NOT NEW.`grid_lat` OR OLD.`grid_lon` IS NOT NEW.`grid_lon` OR OLD.`form` IS NOT NEW.`form` OR OLD.`season` IS NOT NEW.`season` OR OLD.`crop` IS NOT NEW.`crop` OR OLD.`outcome` IS NOT NEW.`outcome` OR OLD.`first_ripe_date` IS NOT NEW.`first_ripe_date` OR OLD.`spring_frost_date` IS NOT NEW.`spring_frost_date` OR OLD.`fall_frost_date` IS NOT NEW.`fall_frost_date` OR OLD.`status` IS NOT NEW.`status`) BEGIN
  DELETE FROM `tree_evidence` WHERE `tree_id` = NEW.`tree_id`;
  INSERT INTO `tree_evidence` (`id`, `tree_id`, `user_id`, `variety_id`, `grid_lat`, `grid_lon`, `form`, `reports`, `ripened`, `breba_reports`, `breba_ripened`, `first_ripe_doys`, `frost_to_ripe_days`, `frost_seasons`)
    SELECT s.`cell_base` + ifnull((SELECT max(e.`id`) FROM `tree_evidence` e WHERE e.`id` BETWEEN s.`cell_base` AND s.`cell_base` + 1073741823) - s.`cell_base`, 0)
             + row_number() OVER (PARTITION BY s.`cell_base`),
           s.`tree_id`, s.`user_id`, s.`variety_id`, s.`grid_lat`, s.`grid_lon`, s.`form`, s.`reports`, s.`ripened`, s.`breba_reports`, s.`breba_ripened`,
           s.`first_ripe_doys`, s.`frost_to_ripe_days`, s.`frost_seasons`
      FROM `tree_evidence_source` s WHERE s.`tree_id` = NEW.`tree_id`;
END;
--> statement-breakpoint
CREATE TRIGGER `reports_tree_evidence_update_old_tree` AFTER UPDATE OF `tree_id` ON `reports`
  WHEN OLD.`tree_id` <> NEW.`tree_id` AND OLD.`status` = 'published' BEGIN
  DELETE FROM `tree_evidence` WHERE `tree_id` = OLD.`tree_id`;
  INSERT INTO `tree_evidence` (`id`, `tree_id`, `user_id`, `variety_id`, `grid_lat`, `grid_lon`, `form`, `reports`, `ripened`, `breba_reports`, `breba_ripened`, `first_ripe_doys`, `frost_to_ripe_days`, `frost_seasons`)
    SELECT s.`cell_base` + ifnull((SELECT max(e.`id`) FROM `tree_evidence` e WHERE e.`id` BETWEEN s.`cell_base` AND s.`cell_base` + 1073741823) - s.`cell_base`, 0)
             + row_number() OVER (PARTITION BY s.`cell_base`),
           s.`tree_id`, s.`user_id`, s.`variety_id`, s.`grid_lat`, s.`grid_lon`, s.`form`, s.`reports`, s.`ripened`, s.`breba_reports`, s.`breba_ripened`,
           s.`first_ripe_doys`, s.`frost_to_ripe_days`, s.`frost_seasons`
      FROM `tree_evidence_source` s WHERE s.`tree_id` = OLD.`tree_id`;
END;
--> statement-breakpoint
CREATE TRIGGER `reports_tree_evidence_delete` AFTER DELETE ON `reports` WHEN OLD.`status` = 'published' BEGIN
  DELETE FROM `tree_evidence` WHERE `tree_id` = OLD.`tree_id`;
  INSERT INTO `tree_evidence` (`id`, `tree_id`, `user_id`, `variety_id`, `grid_lat`, `grid_lon`, `form`, `reports`, `ripened`, `breba_reports`, `breba_ripened`, `first_ripe_doys`, `frost_to_ripe_days`, `frost_seasons`)
    SELECT s.`cell_base` + ifnull((SELECT max(e.`id`) FROM `tree_evidence` e WHERE e.`id` BETWEEN s.`cell_base` AND s.`cell_base` + 1073741823) - s.`cell_base`, 0)
             + row_number() OVER (PARTITION BY s.`cell_base`),
           s.`tree_id`, s.`user_id`, s.`variety_id`, s.`grid_lat`, s.`grid_lon`, s.`form`, s.`reports`, s.`ripened`, s.`breba_reports`, s.`breba_ripened`,
           s.`first_ripe_doys`, s.`frost_to_ripe_days`, s.`frost_seasons`
      FROM `tree_evidence_source` s WHERE s.`tree_id` = OLD.`tree_id`;
END;
--> statement-breakpoint
INSERT INTO `tree_evidence` (`id`, `tree_id`, `user_id`, `variety_id`, `grid_lat`, `grid_lon`, `form`, `reports`, `ripened`, `breba_reports`, `breba_ripened`, `first_ripe_doys`, `frost_to_ripe_days`, `frost_seasons`)
    SELECT s.`cell_base` + ifnull((SELECT max(e.`id`) FROM `tree_evidence` e WHERE e.`id` BETWEEN s.`cell_base` AND s.`cell_base` + 1073741823) - s.`cell_base`, 0)
             + row_number() OVER (PARTITION BY s.`cell_base`),
           s.`tree_id`, s.`user_id`, s.`variety_id`, s.`grid_lat`, s.`grid_lon`, s.`form`, s.`reports`, s.`ripened`, s.`breba_reports`, s.`breba_ripened`,
           s.`first_ripe_doys`, s.`frost_to_ripe_days`, s.`frost_seasons`
      FROM `tree_evidence_source` s;
