CREATE TABLE `organizations` (
	`id` int AUTO_INCREMENT NOT NULL,
	`name` varchar(160) NOT NULL,
	`kind` enum('feed_mill','farm','advisory') NOT NULL,
	`created_at` timestamp NOT NULL DEFAULT (now()),
	CONSTRAINT `organizations_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `seed_runs` (
	`name` varchar(80) NOT NULL,
	`applied_at` timestamp NOT NULL DEFAULT (now()),
	CONSTRAINT `seed_runs_name` PRIMARY KEY(`name`)
);
