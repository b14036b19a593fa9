-- R*Tree indexes for spatial look-ups (drizzle-kit does not model virtual tables).
-- Triggers keep them in step with their tables; a bounding-box query on the index is then
-- refined by an exact great-circle distance in the application.
CREATE VIRTUAL TABLE `reports_rtree` USING rtree(`id`, `min_lat`, `max_lat`, `min_lon`, `max_lon`);
--> statement-breakpoint
CREATE TRIGGER `reports_rtree_insert` AFTER INSERT ON `reports` BEGIN
  INSERT INTO `reports_rtree` VALUES (NEW.`id`, NEW.`lat`, NEW.`lat`, NEW.`lon`, NEW.`lon`);
END;
--> statement-breakpoint
CREATE TRIGGER `reports_rtree_update` AFTER UPDATE OF `lat`, `lon` ON `reports` BEGIN
  UPDATE `reports_rtree` SET `min_lat` = NEW.`lat`, `max_lat` = NEW.`lat`, `min_lon` = NEW.`lon`, `max_lon` = NEW.`lon` WHERE `id` = NEW.`id`;
END;
--> statement-breakpoint
CREATE TRIGGER `reports_rtree_delete` AFTER DELETE ON `reports` BEGIN
  DELETE FROM `reports_rtree` WHERE `id` = OLD.`id`;
END;
--> statement-breakpoint
CREATE VIRTUAL TABLE `stations_rtree` USING rtree(`id`, `min_lat`, `max_lat`, `min_lon`, `max_lon`);
--> statement-breakpoint
CREATE TRIGGER `stations_rtree_insert` AFTER INSERT ON `stations` BEGIN
  INSERT INTO `stations_rtree` VALUES (NEW.`id`, NEW.`lat`, NEW.`lat`, NEW.`lon`, NEW.`lon`);
END;
--> statement-breakpoint
CREATE TRIGGER `stations_rtree_update` AFTER UPDATE OF `lat`, `lon` ON `stations` BEGIN
  UPDATE `stations_rtree` SET `min_lat` = NEW.`lat`, `max_lat` = NEW.`lat`, `min_lon` = NEW.`lon`, `max_lon` = NEW.`lon` WHERE `id` = NEW.`id`;
END;
--> statement-breakpoint
CREATE TRIGGER `stations_rtree_delete` AFTER DELETE ON `stations` BEGIN
  DELETE FROM `stations_rtree` WHERE `id` = OLD.`id`;
END;
