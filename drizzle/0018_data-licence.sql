-- When a grower agreed that their published reports are shared as open data (CC BY 4.0, credited to
-- "Syconium contributors"); null = not agreed. Demo accounts count as agreed (they are invented).
ALTER TABLE `users` ADD `data_licence_agreed_at` text;
--> statement-breakpoint
UPDATE `users` SET `data_licence_agreed_at` = `created_at` WHERE `is_demo` = 1;
