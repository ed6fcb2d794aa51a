CREATE TABLE `materials` (
	`id` int AUTO_INCREMENT NOT NULL,
	`name` varchar(120) NOT NULL,
	`k_w_mk` double NOT NULL,
	`density_kg_m3` double NOT NULL,
	`specific_heat_j_kgk` double NOT NULL,
	`properties_at_c` double,
	`graded_profile` json,
	`notes` text,
	`source` text NOT NULL,
	`created_by` int,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `materials_id` PRIMARY KEY(`id`),
	CONSTRAINT `materials_name_unique` UNIQUE(`name`)
);
--> statement-breakpoint
CREATE TABLE `plan_revisions` (
	`id` int AUTO_INCREMENT NOT NULL,
	`plan_id` int NOT NULL,
	`revision` int NOT NULL,
	`spec` json NOT NULL,
	`summary` json,
	`note` varchar(255),
	`created_by` int,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `plan_revisions_id` PRIMARY KEY(`id`),
	CONSTRAINT `plan_revision_unique` UNIQUE(`plan_id`,`revision`)
);
--> statement-breakpoint
CREATE TABLE `plans` (
	`id` int AUTO_INCREMENT NOT NULL,
	`name` varchar(160) NOT NULL,
	`latest_revision` int NOT NULL DEFAULT 1,
	`archived` boolean NOT NULL DEFAULT false,
	`created_by` int,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `plans_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `quenchants` (
	`id` int AUTO_INCREMENT NOT NULL,
	`name` varchar(120) NOT NULL,
	`kind` enum('oil','water','polymer','salt','forced-air','still-air','gas') NOT NULL,
	`h_typical_w_m2k` double NOT NULL,
	`h_low_w_m2k` double NOT NULL,
	`h_high_w_m2k` double NOT NULL,
	`bath_c` double NOT NULL,
	`notes` text,
	`source` text NOT NULL,
	`created_by` int,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `quenchants_id` PRIMARY KEY(`id`),
	CONSTRAINT `quenchants_name_unique` UNIQUE(`name`)
);
--> statement-breakpoint
ALTER TABLE `materials` ADD CONSTRAINT `materials_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `plan_revisions` ADD CONSTRAINT `plan_revisions_plan_id_plans_id_fk` FOREIGN KEY (`plan_id`) REFERENCES `plans`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `plan_revisions` ADD CONSTRAINT `plan_revisions_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `plans` ADD CONSTRAINT `plans_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `quenchants` ADD CONSTRAINT `quenchants_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;