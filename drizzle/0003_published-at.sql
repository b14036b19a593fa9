ALTER TABLE `reports` ADD `published_at` text;--> statement-breakpoint
-- Reports already public (published, or published and later hidden) count as published when written.
UPDATE `reports` SET `published_at` = `created_at` WHERE `status` <> 'draft' AND `published_at` IS NULL;
--> statement-breakpoint
-- A row inserted as non-draft without a publication time (the demo seed, bulk loads, tests) takes its
-- creation time, like a default that depends on the status. The app sets it itself when it creates a
-- published report or publishes a draft (server/reports/reports.router.ts).
CREATE TRIGGER `reports_published_at_insert` AFTER INSERT ON `reports`
WHEN NEW.`status` <> 'draft' AND NEW.`published_at` IS NULL BEGIN
  UPDATE `reports` SET `published_at` = NEW.`created_at` WHERE `id` = NEW.`id`;
END;
