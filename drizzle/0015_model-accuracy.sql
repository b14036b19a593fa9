-- The chance model's leave-one-grower-out accuracy, as the background job last computed it (one row).
CREATE TABLE `model_accuracy` (
  `id` integer PRIMARY KEY NOT NULL CHECK (`id` = 1),
  `computed_at` text NOT NULL,
  `data_version` integer NOT NULL,
  `body` text NOT NULL
);
