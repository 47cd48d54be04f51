CREATE TABLE `supply_plans` (
	`id` int AUTO_INCREMENT NOT NULL,
	`organization_id` int NOT NULL,
	`name` varchar(160) NOT NULL,
	`notes` text,
	`defatted` boolean NOT NULL DEFAULT false,
	`residual_fat_pct` double,
	`meal_dry_matter_pct` double,
	`residue_moisture_pct` double,
	`meal_ingredient_id` int,
	`soybean_yield_t_per_ha` double,
	`soybean_yield_source` varchar(300),
	`soybean_cp_pct` double,
	`weeks_per_year` int,
	`version` int NOT NULL DEFAULT 1,
	`created_by_user_id` varchar(40),
	`created_at` timestamp NOT NULL DEFAULT (now()),
	`updated_at` timestamp NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `supply_plans_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `supply_streams` (
	`id` int AUTO_INCREMENT NOT NULL,
	`plan_id` int NOT NULL,
	`position` int NOT NULL,
	`name` varchar(160) NOT NULL,
	`substrate` enum('food_waste','brewery_grains','fruit_vegetable_waste','fish_offal','slaughter_by_products','manure') NOT NULL,
	`tonnes_per_week` double NOT NULL,
	`moisture_pct` double,
	`substrate_cp_dm_pct` double,
	`bioconversion_dm_pct` double,
	`residue_dm_pct` double,
	`larvae_dry_matter_pct` double,
	`animals` json,
	CONSTRAINT `supply_streams_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `supply_plans` ADD CONSTRAINT `supply_plans_organization_id_organizations_id_fk` FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `supply_plans` ADD CONSTRAINT `supply_plans_meal_ingredient_id_ingredients_id_fk` FOREIGN KEY (`meal_ingredient_id`) REFERENCES `ingredients`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `supply_plans` ADD CONSTRAINT `supply_plans_created_by_user_id_users_id_fk` FOREIGN KEY (`created_by_user_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `supply_streams` ADD CONSTRAINT `supply_streams_plan_id_supply_plans_id_fk` FOREIGN KEY (`plan_id`) REFERENCES `supply_plans`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `supply_plans_org` ON `supply_plans` (`organization_id`,`name`);--> statement-breakpoint
CREATE INDEX `supply_streams_plan` ON `supply_streams` (`plan_id`,`position`);