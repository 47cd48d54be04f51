ALTER TABLE `lab_import_analyses` MODIFY COLUMN `lab_import_id` int;--> statement-breakpoint
ALTER TABLE `lab_import_analyses` MODIFY COLUMN `sample_id` varchar(120);--> statement-breakpoint
ALTER TABLE `lab_import_analyses` ADD `entry` enum('file','typed') DEFAULT 'file' NOT NULL;--> statement-breakpoint
ALTER TABLE `lab_import_analyses` ADD `laboratory` varchar(200);--> statement-breakpoint
ALTER TABLE `lab_import_analyses` ADD `recorded_by_user_id` varchar(40);--> statement-breakpoint
ALTER TABLE `lab_import_analyses` ADD `applied_nutrient_ids` json;--> statement-breakpoint
ALTER TABLE `lab_import_analyses` ADD CONSTRAINT `lab_import_analyses_recorded_by_user_id_users_id_fk` FOREIGN KEY (`recorded_by_user_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;