-- A second data version (see 0005_data-version.sql): the row 'stations' moves on every insert,
-- update or delete of a station or of a station's summary, whichever connection commits it, so the
-- in-memory station snapshot (server/stations/station-snapshot.ts) can tell in one indexed read
-- whether it is still current. Read it with `stationsDataVersion(db)` in server/db/data-version.ts.
-- station_days and station_freeze_years have no trigger: nothing cached reads them, and an upload
-- writes tens of thousands of days.
INSERT INTO `data_versions` (`name`, `version`) VALUES ('stations', 0);
--> statement-breakpoint
CREATE TRIGGER `stations_stations_version_insert` AFTER INSERT ON `stations` BEGIN
  UPDATE `data_versions` SET `version` = `version` + 1 WHERE `name` = 'stations';
END;
--> statement-breakpoint
CREATE TRIGGER `stations_stations_version_update` AFTER UPDATE ON `stations` BEGIN
  UPDATE `data_versions` SET `version` = `version` + 1 WHERE `name` = 'stations';
END;
--> statement-breakpoint
CREATE TRIGGER `stations_stations_version_delete` AFTER DELETE ON `stations` BEGIN
  UPDATE `data_versions` SET `version` = `version` + 1 WHERE `name` = 'stations';
END;
--> statement-breakpoint
CREATE TRIGGER `station_summaries_stations_version_insert` AFTER INSERT ON `station_summaries` BEGIN
  UPDATE `data_versions` SET `version` = `version` + 1 WHERE `name` = 'stations';
END;
--> statement-breakpoint
CREATE TRIGGER `station_summaries_stations_version_update` AFTER UPDATE ON `station_summaries` BEGIN
  UPDATE `data_versions` SET `version` = `version` + 1 WHERE `name` = 'stations';
END;
--> statement-breakpoint
CREATE TRIGGER `station_summaries_stations_version_delete` AFTER DELETE ON `station_summaries` BEGIN
  UPDATE `data_versions` SET `version` = `version` + 1 WHERE `name` = 'stations';
END;
