CREATE TABLE `formula_versions` (
	`id` int AUTO_INCREMENT NOT NULL,
	`formula_id` int NOT NULL,
	`organization_id` int NOT NULL,
	`number` int NOT NULL,
	`status` enum('optimal','infeasible','unbounded','failed') NOT NULL,
	`cost_per_tonne` double,
	`note` varchar(500),
	`snapshot` json NOT NULL,
	`created_by_user_id` varchar(40),
	`created_by_name` varchar(160) NOT NULL,
	`created_at` timestamp NOT NULL DEFAULT (now()),
	`approved_by_user_id` varchar(40),
	`approved_by_name` varchar(160),
	`approved_at` timestamp(3),
	CONSTRAINT `formula_versions_id` PRIMARY KEY(`id`),
	CONSTRAINT `formula_versions_number` UNIQUE(`formula_id`,`number`)
);
--> statement-breakpoint
CREATE TABLE `formulas` (
	`id` int AUTO_INCREMENT NOT NULL,
	`organization_id` int NOT NULL,
	`name` varchar(160) NOT NULL,
	`species_id` int,
	`specification_id` int,
	`inputs` json NOT NULL,
	`revision` int NOT NULL DEFAULT 1,
	`created_by_user_id` varchar(40),
	`created_at` timestamp NOT NULL DEFAULT (now()),
	`updated_at` timestamp NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `formulas_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `formula_versions` ADD CONSTRAINT `formula_versions_formula_id_formulas_id_fk` FOREIGN KEY (`formula_id`) REFERENCES `formulas`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `formula_versions` ADD CONSTRAINT `formula_versions_organization_id_organizations_id_fk` FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `formula_versions` ADD CONSTRAINT `formula_versions_created_by_user_id_users_id_fk` FOREIGN KEY (`created_by_user_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `formula_versions` ADD CONSTRAINT `formula_versions_approved_by_user_id_users_id_fk` FOREIGN KEY (`approved_by_user_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `formulas` ADD CONSTRAINT `formulas_organization_id_organizations_id_fk` FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `formulas` ADD CONSTRAINT `formulas_species_id_species_id_fk` FOREIGN KEY (`species_id`) REFERENCES `species`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `formulas` ADD CONSTRAINT `formulas_specification_id_specifications_id_fk` FOREIGN KEY (`specification_id`) REFERENCES `specifications`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `formulas` ADD CONSTRAINT `formulas_created_by_user_id_users_id_fk` FOREIGN KEY (`created_by_user_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `formula_versions_org_approved` ON `formula_versions` (`organization_id`,`approved_at`);--> statement-breakpoint
CREATE INDEX `formulas_org_name` ON `formulas` (`organization_id`,`name`);