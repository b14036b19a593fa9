-- tree_evidence rows get ids that follow their place: the id's high part is a 0.1-degree grid cell
-- numbered row by row (latitude band, then longitude), the low part a counter within the cell.
-- Rows near each other then sit near each other in the table, so a radius query's look-ups from
-- its R*Tree land on few pages (on a million reports, about half the time of ids in insertion
-- order). Cell numbers stay below 6.5 million and counters below 2^30, so ids stay below 2^53
-- (exact in JavaScript).
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
CREATE VIEW `tree_evidence_source` AS
SELECT (CAST((`lat` + 90) * 10 AS integer) * 3601 + CAST((`lon` + 180) * 10 AS integer)) * 1073741824 AS `cell_base`,
       `tree_id`, `user_id`, `variety_id`, `lat`, `lon`, `form`,
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
-- Each trigger rebuilds one tree's rows, each new row taking the next free counter of its cell.
CREATE TRIGGER `reports_tree_evidence_insert` AFTER INSERT ON `reports` WHEN NEW.`status` = 'published' BEGIN
  DELETE FROM `tree_evidence` WHERE `tree_id` = NEW.`tree_id`;
  INSERT INTO `tree_evidence` (`id`, `tree_id`, `user_id`, `variety_id`, `lat`, `lon`, `form`, `reports`, `ripened`, `breba_reports`, `breba_ripened`, `first_ripe_doys`, `frost_to_ripe_days`, `frost_seasons`)
    SELECT s.`cell_base` + ifnull((SELECT max(e.`id`) FROM `tree_evidence` e WHERE e.`id` BETWEEN s.`cell_base` AND s.`cell_base` + 1073741823) - s.`cell_base`, 0)
             + row_number() OVER (PARTITION BY s.`cell_base`),
           s.`tree_id`, s.`user_id`, s.`variety_id`, s.`lat`, s.`lon`, s.`form`, s.`reports`, s.`ripened`, s.`breba_reports`, s.`breba_ripened`,
           s.`first_ripe_doys`, s.`frost_to_ripe_days`, s.`frost_seasons`
      FROM `tree_evidence_source` s WHERE s.`tree_id` = NEW.`tree_id`;
END;
--> statement-breakpoint
CREATE TRIGGER `reports_tree_evidence_update` AFTER UPDATE OF `tree_id`, `user_id`, `variety_id`, `lat`, `lon`, `form`, `season`, `crop`, `outcome`, `first_ripe_date`, `spring_frost_date`, `fall_frost_date`, `status` ON `reports`
  WHEN OLD.`status` = 'published' OR NEW.`status` = 'published' BEGIN
  DELETE FROM `tree_evidence` WHERE `tree_id` = NEW.`tree_id`;
  INSERT INTO `tree_evidence` (`id`, `tree_id`, `user_id`, `variety_id`, `lat`, `lon`, `form`, `reports`, `ripened`, `breba_reports`, `breba_ripened`, `first_ripe_doys`, `frost_to_ripe_days`, `frost_seasons`)
    SELECT s.`cell_base` + ifnull((SELECT max(e.`id`) FROM `tree_evidence` e WHERE e.`id` BETWEEN s.`cell_base` AND s.`cell_base` + 1073741823) - s.`cell_base`, 0)
             + row_number() OVER (PARTITION BY s.`cell_base`),
           s.`tree_id`, s.`user_id`, s.`variety_id`, s.`lat`, s.`lon`, s.`form`, s.`reports`, s.`ripened`, s.`breba_reports`, s.`breba_ripened`,
           s.`first_ripe_doys`, s.`frost_to_ripe_days`, s.`frost_seasons`
      FROM `tree_evidence_source` s WHERE s.`tree_id` = NEW.`tree_id`;
END;
--> statement-breakpoint
CREATE TRIGGER `reports_tree_evidence_update_old_tree` AFTER UPDATE OF `tree_id` ON `reports`
  WHEN OLD.`tree_id` <> NEW.`tree_id` AND OLD.`status` = 'published' BEGIN
  DELETE FROM `tree_evidence` WHERE `tree_id` = OLD.`tree_id`;
  INSERT INTO `tree_evidence` (`id`, `tree_id`, `user_id`, `variety_id`, `lat`, `lon`, `form`, `reports`, `ripened`, `breba_reports`, `breba_ripened`, `first_ripe_doys`, `frost_to_ripe_days`, `frost_seasons`)
    SELECT s.`cell_base` + ifnull((SELECT max(e.`id`) FROM `tree_evidence` e WHERE e.`id` BETWEEN s.`cell_base` AND s.`cell_base` + 1073741823) - s.`cell_base`, 0)
             + row_number() OVER (PARTITION BY s.`cell_base`),
           s.`tree_id`, s.`user_id`, s.`variety_id`, s.`lat`, s.`lon`, s.`form`, s.`reports`, s.`ripened`, s.`breba_reports`, s.`breba_ripened`,
           s.`first_ripe_doys`, s.`frost_to_ripe_days`, s.`frost_seasons`
      FROM `tree_evidence_source` s WHERE s.`tree_id` = OLD.`tree_id`;
END;
--> statement-breakpoint
CREATE TRIGGER `reports_tree_evidence_delete` AFTER DELETE ON `reports` WHEN OLD.`status` = 'published' BEGIN
  DELETE FROM `tree_evidence` WHERE `tree_id` = OLD.`tree_id`;
  INSERT INTO `tree_evidence` (`id`, `tree_id`, `user_id`, `variety_id`, `lat`, `lon`, `form`, `reports`, `ripened`, `breba_reports`, `breba_ripened`, `first_ripe_doys`, `frost_to_ripe_days`, `frost_seasons`)
    SELECT s.`cell_base` + ifnull((SELECT max(e.`id`) FROM `tree_evidence` e WHERE e.`id` BETWEEN s.`cell_base` AND s.`cell_base` + 1073741823) - s.`cell_base`, 0)
             + row_number() OVER (PARTITION BY s.`cell_base`),
           s.`tree_id`, s.`user_id`, s.`variety_id`, s.`lat`, s.`lon`, s.`form`, s.`reports`, s.`ripened`, s.`breba_reports`, s.`breba_ripened`,
           s.`first_ripe_doys`, s.`frost_to_ripe_days`, s.`frost_seasons`
      FROM `tree_evidence_source` s WHERE s.`tree_id` = OLD.`tree_id`;
END;
--> statement-breakpoint
-- Renumber the rows already there (the R*Tree follows through its triggers).
DELETE FROM `tree_evidence`;
--> statement-breakpoint
INSERT INTO `tree_evidence` (`id`, `tree_id`, `user_id`, `variety_id`, `lat`, `lon`, `form`, `reports`, `ripened`, `breba_reports`, `breba_ripened`, `first_ripe_doys`, `frost_to_ripe_days`, `frost_seasons`)
    SELECT s.`cell_base` + ifnull((SELECT max(e.`id`) FROM `tree_evidence` e WHERE e.`id` BETWEEN s.`cell_base` AND s.`cell_base` + 1073741823) - s.`cell_base`, 0)
             + row_number() OVER (PARTITION BY s.`cell_base`),
           s.`tree_id`, s.`user_id`, s.`variety_id`, s.`lat`, s.`lon`, s.`form`, s.`reports`, s.`ripened`, s.`breba_reports`, s.`breba_ripened`,
           s.`first_ripe_doys`, s.`frost_to_ripe_days`, s.`frost_seasons`
      FROM `tree_evidence_source` s;
