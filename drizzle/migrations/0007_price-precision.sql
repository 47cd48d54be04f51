ALTER TABLE `ingredient_prices` MODIFY COLUMN `price_per_kg` decimal(20,10) NOT NULL;--> statement-breakpoint
ALTER TABLE `ingredients` MODIFY COLUMN `price_per_kg` decimal(20,10);