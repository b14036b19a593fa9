-- The regional engine now answers radius queries from an in-memory snapshot of tree_evidence
-- (server/atlas/tree-snapshot.ts: a k-d tree over the rows, and each variety's overall figures
-- computed from the same rows). The table's own R*Tree and the covering indexes for the overall
-- figures are no longer read, and every report write paid for keeping them: they go.
DROP TRIGGER `tree_evidence_rtree_insert`;
--> statement-breakpoint
DROP TRIGGER `tree_evidence_rtree_delete`;
--> statement-breakpoint
DROP TABLE `tree_evidence_rtree`;
--> statement-breakpoint
DROP INDEX `tree_evidence_variety_tree_idx`;
--> statement-breakpoint
DROP INDEX `tree_evidence_ground_need_idx`;
