CREATE TABLE `batch_logs` (
	`id` int AUTO_INCREMENT NOT NULL,
	`organization_id` int NOT NULL,
	`formula_id` int,
	`version_id` int,
	`formula_name` varchar(160) NOT NULL,
	`version_number` int NOT NULL,
	`made_on` date NOT NULL,
	`batch_kg` double NOT NULL,
	`operator_name` varchar(120) NOT NULL,
	`deviation` varchar(1000),
	`recorded_by_user_id` varchar(40),
	`created_at` timestamp NOT NULL DEFAULT (now()),
	CONSTRAINT `batch_logs_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `organization_settings` (
	`organization_id` int NOT NULL,
	`unit_system` enum('metric','us') NOT NULL DEFAULT 'metric',
	`currency` varchar(3) NOT NULL DEFAULT 'EUR',
	`updated_at` timestamp NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `organization_settings_organization_id` PRIMARY KEY(`organization_id`)
);
--> statement-breakpoint
CREATE TABLE `shares` (
	`id` int AUTO_INCREMENT NOT NULL,
	`token` varchar(32) NOT NULL,
	`from_organization_id` int NOT NULL,
	`to_organization_id` int NOT NULL,
	`kind` enum('formula_version','ration_check') NOT NULL,
	`title` varchar(200) NOT NULL,
	`note` varchar(1000),
	`payload` json NOT NULL,
	`shared_by_user_id` varchar(40),
	`shared_by_name` varchar(160) NOT NULL,
	`recipients` json NOT NULL,
	`created_at` timestamp NOT NULL DEFAULT (now()),
	CONSTRAINT `shares_id` PRIMARY KEY(`id`),
	CONSTRAINT `shares_token_unique` UNIQUE(`token`)
);
--> statement-breakpoint
ALTER TABLE `batch_logs` ADD CONSTRAINT `batch_logs_organization_id_organizations_id_fk` FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `batch_logs` ADD CONSTRAINT `batch_logs_formula_id_formulas_id_fk` FOREIGN KEY (`formula_id`) REFERENCES `formulas`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `batch_logs` ADD CONSTRAINT `batch_logs_version_id_formula_versions_id_fk` FOREIGN KEY (`version_id`) REFERENCES `formula_versions`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `batch_logs` ADD CONSTRAINT `batch_logs_recorded_by_user_id_users_id_fk` FOREIGN KEY (`recorded_by_user_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `organization_settings` ADD CONSTRAINT `organization_settings_organization_id_organizations_id_fk` FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `shares` ADD CONSTRAINT `shares_from_organization_id_organizations_id_fk` FOREIGN KEY (`from_organization_id`) REFERENCES `organizations`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `shares` ADD CONSTRAINT `shares_to_organization_id_organizations_id_fk` FOREIGN KEY (`to_organization_id`) REFERENCES `organizations`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `shares` ADD CONSTRAINT `shares_shared_by_user_id_users_id_fk` FOREIGN KEY (`shared_by_user_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `batch_logs_org_made` ON `batch_logs` (`organization_id`,`made_on`);--> statement-breakpoint
CREATE INDEX `shares_to_org` ON `shares` (`to_organization_id`,`created_at`);