CREATE TABLE `ingredient_values` (
	`ingredient_id` int NOT NULL,
	`nutrient_id` varchar(40) NOT NULL,
	`value_set_id` int NOT NULL,
	`value` double NOT NULL,
	CONSTRAINT `ingredient_values_ingredient_id_nutrient_id_pk` PRIMARY KEY(`ingredient_id`,`nutrient_id`)
);
--> statement-breakpoint
CREATE TABLE `ingredient_prices` (
	`id` int AUTO_INCREMENT NOT NULL,
	`ingredient_id` int NOT NULL,
	`price_per_kg` decimal(12,4) NOT NULL,
	`effective_on` date NOT NULL,
	`recorded_by_user_id` varchar(40),
	`recorded_at` timestamp NOT NULL DEFAULT (now()),
	CONSTRAINT `ingredient_prices_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `value_sets` (
	`id` int AUTO_INCREMENT NOT NULL,
	`ingredient_id` int NOT NULL,
	`source_kind` enum('table','lab','estimate') NOT NULL,
	`source_name` varchar(300) NOT NULL,
	`confidence` enum('verified','derived','from_memory') NOT NULL,
	`analysed_on` date,
	`dry_matter_pct` double NOT NULL,
	`note` varchar(500),
	`created_at` timestamp NOT NULL DEFAULT (now()),
	CONSTRAINT `value_sets_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `ingredients` (
	`id` int AUTO_INCREMENT NOT NULL,
	`organization_id` int,
	`code` varchar(60),
	`copied_from_id` int,
	`name` varchar(160) NOT NULL,
	`category` enum('cereal_grain','cereal_by_product','oilseed_meal','animal_protein','insect_meal','fat_and_oil','mineral','synthetic_amino_acid','premix') NOT NULL,
	`notes` text,
	`insect_species` enum('hermetia_illucens','tenebrio_molitor','musca_domestica'),
	`insect_processing` enum('full_fat','partially_defatted','defatted'),
	`substrate` varchar(200),
	`substrate_origin` enum('plant','animal','mixed','unknown'),
	`substrate_animals` json,
	`price_per_kg` decimal(12,4),
	`price_date` date,
	`version` int NOT NULL DEFAULT 1,
	`created_at` timestamp NOT NULL DEFAULT (now()),
	`updated_at` timestamp NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `ingredients_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `nutrients` (
	`id` varchar(40) NOT NULL,
	`name` varchar(120) NOT NULL,
	`unit` enum('%','g/kg','mg/kg','kcal/kg','MJ/kg','IU/kg') NOT NULL,
	`nutrient_group` enum('proximate','energy','amino_acids','minerals','fat_and_fibre','insect') NOT NULL,
	`families` json NOT NULL,
	`basis` enum('total','digestible','sid'),
	`sort_order` int NOT NULL,
	`description` varchar(300),
	CONSTRAINT `nutrients_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `phases` (
	`id` int AUTO_INCREMENT NOT NULL,
	`species_id` int NOT NULL,
	`organization_id` int,
	`name` varchar(120) NOT NULL,
	`span` varchar(120),
	`age_from_days` int,
	`age_to_days` int,
	`body_weight_from_kg` double,
	`body_weight_to_kg` double,
	`sort_order` int NOT NULL DEFAULT 100,
	CONSTRAINT `phases_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `species` (
	`id` int AUTO_INCREMENT NOT NULL,
	`organization_id` int,
	`code` varchar(40) NOT NULL,
	`name` varchar(120) NOT NULL,
	`family` enum('poultry','swine') NOT NULL,
	`sort_order` int NOT NULL DEFAULT 100,
	CONSTRAINT `species_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `specification_caps` (
	`id` int AUTO_INCREMENT NOT NULL,
	`specification_id` int NOT NULL,
	`scope` enum('ingredient','category','insect_species') NOT NULL,
	`ingredient_id` int,
	`category` enum('cereal_grain','cereal_by_product','oilseed_meal','animal_protein','insect_meal','fat_and_oil','mineral','synthetic_amino_acid','premix'),
	`insect_species` enum('hermetia_illucens','tenebrio_molitor','musca_domestica'),
	`min_pct` double,
	`max_pct` double,
	`soft` boolean NOT NULL DEFAULT true,
	`source` varchar(300) NOT NULL,
	`note` varchar(300),
	CONSTRAINT `specification_caps_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `specification_nutrients` (
	`id` int AUTO_INCREMENT NOT NULL,
	`specification_id` int NOT NULL,
	`nutrient_id` varchar(40) NOT NULL,
	`min` double,
	`max` double,
	`confidence` enum('verified','derived','from_memory'),
	`note` varchar(300),
	CONSTRAINT `specification_nutrients_id` PRIMARY KEY(`id`),
	CONSTRAINT `spec_nutrients_unique` UNIQUE(`specification_id`,`nutrient_id`)
);
--> statement-breakpoint
CREATE TABLE `specification_ratios` (
	`id` int AUTO_INCREMENT NOT NULL,
	`specification_id` int NOT NULL,
	`numerator_id` varchar(40) NOT NULL,
	`denominator_id` varchar(40) NOT NULL,
	`min` double,
	`max` double,
	`confidence` enum('verified','derived','from_memory'),
	`note` varchar(300),
	CONSTRAINT `specification_ratios_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `specifications` (
	`id` int AUTO_INCREMENT NOT NULL,
	`organization_id` int,
	`code` varchar(60),
	`copied_from_id` int,
	`species_id` int NOT NULL,
	`phase_id` int,
	`name` varchar(160) NOT NULL,
	`source` varchar(300) NOT NULL,
	`notes` text,
	`feed_intake_g_per_day` double,
	`version` int NOT NULL DEFAULT 1,
	`created_at` timestamp NOT NULL DEFAULT (now()),
	`updated_at` timestamp NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `specifications_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `ingredient_values` ADD CONSTRAINT `ingredient_values_ingredient_id_ingredients_id_fk` FOREIGN KEY (`ingredient_id`) REFERENCES `ingredients`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ingredient_values` ADD CONSTRAINT `ingredient_values_nutrient_id_nutrients_id_fk` FOREIGN KEY (`nutrient_id`) REFERENCES `nutrients`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ingredient_values` ADD CONSTRAINT `ingredient_values_value_set_id_value_sets_id_fk` FOREIGN KEY (`value_set_id`) REFERENCES `value_sets`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ingredient_prices` ADD CONSTRAINT `ingredient_prices_ingredient_id_ingredients_id_fk` FOREIGN KEY (`ingredient_id`) REFERENCES `ingredients`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ingredient_prices` ADD CONSTRAINT `ingredient_prices_recorded_by_user_id_users_id_fk` FOREIGN KEY (`recorded_by_user_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `value_sets` ADD CONSTRAINT `value_sets_ingredient_id_ingredients_id_fk` FOREIGN KEY (`ingredient_id`) REFERENCES `ingredients`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ingredients` ADD CONSTRAINT `ingredients_organization_id_organizations_id_fk` FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `phases` ADD CONSTRAINT `phases_species_id_species_id_fk` FOREIGN KEY (`species_id`) REFERENCES `species`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `phases` ADD CONSTRAINT `phases_organization_id_organizations_id_fk` FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `species` ADD CONSTRAINT `species_organization_id_organizations_id_fk` FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `specification_caps` ADD CONSTRAINT `specification_caps_specification_id_specifications_id_fk` FOREIGN KEY (`specification_id`) REFERENCES `specifications`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `specification_caps` ADD CONSTRAINT `specification_caps_ingredient_id_ingredients_id_fk` FOREIGN KEY (`ingredient_id`) REFERENCES `ingredients`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `specification_nutrients` ADD CONSTRAINT `specification_nutrients_specification_id_specifications_id_fk` FOREIGN KEY (`specification_id`) REFERENCES `specifications`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `specification_nutrients` ADD CONSTRAINT `specification_nutrients_nutrient_id_nutrients_id_fk` FOREIGN KEY (`nutrient_id`) REFERENCES `nutrients`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `specification_ratios` ADD CONSTRAINT `specification_ratios_specification_id_specifications_id_fk` FOREIGN KEY (`specification_id`) REFERENCES `specifications`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `specification_ratios` ADD CONSTRAINT `specification_ratios_numerator_id_nutrients_id_fk` FOREIGN KEY (`numerator_id`) REFERENCES `nutrients`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `specification_ratios` ADD CONSTRAINT `specification_ratios_denominator_id_nutrients_id_fk` FOREIGN KEY (`denominator_id`) REFERENCES `nutrients`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `specifications` ADD CONSTRAINT `specifications_organization_id_organizations_id_fk` FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `specifications` ADD CONSTRAINT `specifications_species_id_species_id_fk` FOREIGN KEY (`species_id`) REFERENCES `species`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `specifications` ADD CONSTRAINT `specifications_phase_id_phases_id_fk` FOREIGN KEY (`phase_id`) REFERENCES `phases`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `values_set` ON `ingredient_values` (`value_set_id`);--> statement-breakpoint
CREATE INDEX `prices_ingredient_date` ON `ingredient_prices` (`ingredient_id`,`effective_on`);--> statement-breakpoint
CREATE INDEX `value_sets_ingredient` ON `value_sets` (`ingredient_id`);--> statement-breakpoint
CREATE INDEX `ingredients_org_name` ON `ingredients` (`organization_id`,`name`);--> statement-breakpoint
CREATE INDEX `ingredients_org_category` ON `ingredients` (`organization_id`,`category`);--> statement-breakpoint
CREATE INDEX `phases_species` ON `phases` (`species_id`);--> statement-breakpoint
CREATE INDEX `specifications_org_species` ON `specifications` (`organization_id`,`species_id`);