CREATE TABLE `batch_events` (
	`id` int AUTO_INCREMENT NOT NULL,
	`batch_id` int NOT NULL,
	`from_state` enum('planned','charged','soaking','quenched','cooling','ready','released','cancelled') NOT NULL,
	`to_state` enum('planned','charged','soaking','quenched','cooling','ready','released','cancelled') NOT NULL,
	`at` datetime(3) NOT NULL,
	`actor_id` int,
	CONSTRAINT `batch_events_id` PRIMARY KEY(`id`),
	CONSTRAINT `batch_event_once` UNIQUE(`batch_id`,`to_state`)
);
--> statement-breakpoint
CREATE TABLE `batches` (
	`id` int AUTO_INCREMENT NOT NULL,
	`load_number` varchar(32) NOT NULL,
	`plan_revision_id` int NOT NULL,
	`furnace_id` int NOT NULL,
	`station_id` int NOT NULL,
	`part_count` int NOT NULL,
	`mass_kg` double NOT NULL,
	`reference` varchar(120) NOT NULL,
	`state` enum('planned','charged','soaking','quenched','cooling','ready','released','cancelled') NOT NULL DEFAULT 'planned',
	`planned_charge` datetime(3) NOT NULL,
	`furnace_s` double NOT NULL,
	`furnace_is_default` boolean NOT NULL,
	`minimum_soak_s` double,
	`transfer_s` double NOT NULL,
	`quench_s` double NOT NULL,
	`quench_to_handling_s` double NOT NULL,
	`quench_delay_allowance_s` double NOT NULL,
	`furnace_start` datetime(3) NOT NULL,
	`furnace_end` datetime(3) NOT NULL,
	`quench_start` datetime(3) NOT NULL,
	`quench_end` datetime(3) NOT NULL,
	`handling_at` datetime(3) NOT NULL,
	`charged_at` datetime(3),
	`soaking_at` datetime(3),
	`quenched_at` datetime(3),
	`conflict_with` varchar(32),
	`conflict_note` varchar(255),
	`created_by` int,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `batches_id` PRIMARY KEY(`id`),
	CONSTRAINT `batches_load_number_unique` UNIQUE(`load_number`)
);
--> statement-breakpoint
CREATE TABLE `furnace_stations` (
	`furnace_id` int NOT NULL,
	`station_id` int NOT NULL,
	CONSTRAINT `furnace_stations_furnace_id_station_id_pk` PRIMARY KEY(`furnace_id`,`station_id`)
);
--> statement-breakpoint
CREATE TABLE `furnaces` (
	`id` int AUTO_INCREMENT NOT NULL,
	`name` varchar(80) NOT NULL,
	`kind` enum('box','pit','car-bottom','vacuum','belt','salt-bath') NOT NULL,
	`max_temp_c` double NOT NULL,
	`capacity_kg` double NOT NULL,
	`zone_width_mm` double NOT NULL,
	`zone_depth_mm` double NOT NULL,
	`zone_height_mm` double NOT NULL,
	`active` boolean NOT NULL DEFAULT true,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `furnaces_id` PRIMARY KEY(`id`),
	CONSTRAINT `furnaces_name_unique` UNIQUE(`name`)
);
--> statement-breakpoint
CREATE TABLE `load_counters` (
	`year` int NOT NULL,
	`last` int NOT NULL,
	CONSTRAINT `load_counters_year` PRIMARY KEY(`year`)
);
--> statement-breakpoint
CREATE TABLE `quench_stations` (
	`id` int AUTO_INCREMENT NOT NULL,
	`name` varchar(80) NOT NULL,
	`kind` enum('oil','water','polymer','salt','forced-air','still-air','gas') NOT NULL,
	`max_temp_c` double NOT NULL,
	`capacity_kg` double NOT NULL,
	`active` boolean NOT NULL DEFAULT true,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `quench_stations_id` PRIMARY KEY(`id`),
	CONSTRAINT `quench_stations_name_unique` UNIQUE(`name`)
);
--> statement-breakpoint
CREATE TABLE `shop_settings` (
	`key` varchar(64) NOT NULL,
	`value` double NOT NULL,
	`updated_by` int,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `shop_settings_key` PRIMARY KEY(`key`)
);
--> statement-breakpoint
ALTER TABLE `batch_events` ADD CONSTRAINT `batch_events_batch_id_batches_id_fk` FOREIGN KEY (`batch_id`) REFERENCES `batches`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `batch_events` ADD CONSTRAINT `batch_events_actor_id_users_id_fk` FOREIGN KEY (`actor_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `batches` ADD CONSTRAINT `batches_plan_revision_id_plan_revisions_id_fk` FOREIGN KEY (`plan_revision_id`) REFERENCES `plan_revisions`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `batches` ADD CONSTRAINT `batches_furnace_id_furnaces_id_fk` FOREIGN KEY (`furnace_id`) REFERENCES `furnaces`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `batches` ADD CONSTRAINT `batches_station_id_quench_stations_id_fk` FOREIGN KEY (`station_id`) REFERENCES `quench_stations`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `batches` ADD CONSTRAINT `batches_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `furnace_stations` ADD CONSTRAINT `furnace_stations_furnace_id_furnaces_id_fk` FOREIGN KEY (`furnace_id`) REFERENCES `furnaces`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `furnace_stations` ADD CONSTRAINT `furnace_stations_station_id_quench_stations_id_fk` FOREIGN KEY (`station_id`) REFERENCES `quench_stations`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `shop_settings` ADD CONSTRAINT `shop_settings_updated_by_users_id_fk` FOREIGN KEY (`updated_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `batch_furnace_time_idx` ON `batches` (`furnace_id`,`furnace_start`);--> statement-breakpoint
CREATE INDEX `batch_station_time_idx` ON `batches` (`station_id`,`quench_start`);--> statement-breakpoint
CREATE INDEX `batch_time_idx` ON `batches` (`furnace_start`);