-- A report sent from the phone's outbox carries an id the phone made (POST /api/reports "clientId"):
-- a re-send of the same report (the answer was lost on a weak signal, the tab closed mid-send) finds
-- its row here and gets the stored report back instead of a second copy. Kept apart from `reports`
-- so the reports' triggers, bulk load and prepared insert are unchanged.
CREATE TABLE `report_client_ids` (
	`user_id` integer NOT NULL REFERENCES `users`(`id`) ON DELETE cascade,
	`client_id` text NOT NULL,
	`report_id` integer NOT NULL REFERENCES `reports`(`id`) ON DELETE cascade,
	`created_at` text NOT NULL,
	PRIMARY KEY (`user_id`, `client_id`)
);
--> statement-breakpoint
CREATE INDEX `report_client_ids_report` ON `report_client_ids` (`report_id`);
