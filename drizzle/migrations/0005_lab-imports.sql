CREATE TABLE `lab_column_mappings` (
	`id` int AUTO_INCREMENT NOT NULL,
	`organization_id` int NOT NULL,
	`lab_key` varchar(200) NOT NULL,
	`lab_name` varchar(200) NOT NULL,
	`mapping` json NOT NULL,
	`updated_by_user_id` varchar(40),
	`updated_at` timestamp NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `lab_column_mappings_id` PRIMARY KEY(`id`),
	CONSTRAINT `lab_mappings_org_lab` UNIQUE(`organization_id`,`lab_key`)
);
--> statement-breakpoint
CREATE TABLE `lab_import_analyses` (
	`id` int AUTO_INCREMENT NOT NULL,
	`lab_import_id` int NOT NULL,
	`organization_id` int NOT NULL,
	`ingredient_id` int NOT NULL,
	`created_ingredient` int NOT NULL DEFAULT 0,
	`sample_id` varchar(120) NOT NULL,
	`sample_name` varchar(200),
	`analysed_on` date NOT NULL,
	`dry_matter_pct` double NOT NULL,
	`values` json NOT NULL,
	`created_at` timestamp NOT NULL DEFAULT (now()),
	CONSTRAINT `lab_import_analyses_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `lab_imports` (
	`id` int AUTO_INCREMENT NOT NULL,
	`organization_id` int NOT NULL,
	`uploaded_by_user_id` varchar(40),
	`lab_name` varchar(200) NOT NULL,
	`file_name` varchar(255) NOT NULL,
	`file_bytes` int NOT NULL,
	`raw_text` mediumtext NOT NULL,
	`layout` enum('sample_per_row','nutrient_per_row') NOT NULL,
	`delimiter` varchar(2) NOT NULL,
	`decimal_mark` varchar(1) NOT NULL,
	`mapping` json NOT NULL,
	`estimation_class` varchar(60) NOT NULL,
	`poultry_equation` varchar(60),
	`created_at` timestamp NOT NULL DEFAULT (now()),
	CONSTRAINT `lab_imports_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `lab_column_mappings` ADD CONSTRAINT `lab_column_mappings_organization_id_organizations_id_fk` FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `lab_column_mappings` ADD CONSTRAINT `lab_column_mappings_updated_by_user_id_users_id_fk` FOREIGN KEY (`updated_by_user_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `lab_import_analyses` ADD CONSTRAINT `lab_import_analyses_lab_import_id_lab_imports_id_fk` FOREIGN KEY (`lab_import_id`) REFERENCES `lab_imports`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `lab_import_analyses` ADD CONSTRAINT `lab_import_analyses_organization_id_organizations_id_fk` FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `lab_import_analyses` ADD CONSTRAINT `lab_import_analyses_ingredient_id_ingredients_id_fk` FOREIGN KEY (`ingredient_id`) REFERENCES `ingredients`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `lab_imports` ADD CONSTRAINT `lab_imports_organization_id_organizations_id_fk` FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `lab_imports` ADD CONSTRAINT `lab_imports_uploaded_by_user_id_users_id_fk` FOREIGN KEY (`uploaded_by_user_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `lab_analyses_ingredient` ON `lab_import_analyses` (`organization_id`,`ingredient_id`,`analysed_on`);--> statement-breakpoint
CREATE INDEX `lab_analyses_import` ON `lab_import_analyses` (`lab_import_id`);--> statement-breakpoint
CREATE INDEX `lab_imports_org_created` ON `lab_imports` (`organization_id`,`created_at`);