-- Station look-ups now read the in-memory station snapshot (server/stations/station-snapshot.ts: a
-- k-d tree over every station, re-read when the 'stations' data version of 0010 moves). The
-- stations' R*Tree of 0001_spatial-index.sql is no longer read, and every station write paid for
-- keeping it: it goes, with its triggers.
DROP TRIGGER `stations_rtree_insert`;
--> statement-breakpoint
DROP TRIGGER `stations_rtree_update`;
--> statement-breakpoint
DROP TRIGGER `stations_rtree_delete`;
--> statement-breakpoint
DROP TABLE `stations_rtree`;
