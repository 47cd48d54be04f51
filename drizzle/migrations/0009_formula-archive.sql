ALTER TABLE `formulas` ADD `archived_at` timestamp(3);--> statement-breakpoint
ALTER TABLE `formulas` ADD `archived_by` varchar(40);--> statement-breakpoint
ALTER TABLE `formulas` ADD CONSTRAINT `formulas_archived_by_users_id_fk` FOREIGN KEY (`archived_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `formulas_org_archived` ON `formulas` (`organization_id`,`archived_at`);