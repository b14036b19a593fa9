-- Covering indexes for each variety's overall figures (server/atlas/atlas.repo.ts overallFigures):
-- the mean ripened fraction over its trees, and its in-ground trees' main-crop days from spring
-- frost to first ripe fig, both read in index order without touching the table.
DROP INDEX `tree_evidence_variety_idx`;
--> statement-breakpoint
CREATE INDEX `tree_evidence_variety_tree_idx` ON `tree_evidence` (`variety_id`, `tree_id`, `reports`, `ripened`);
--> statement-breakpoint
CREATE INDEX `tree_evidence_ground_need_idx` ON `tree_evidence` (`variety_id`, `tree_id`, `frost_to_ripe_days`)
  WHERE `form` = 'ground' AND `frost_to_ripe_days` IS NOT NULL;
