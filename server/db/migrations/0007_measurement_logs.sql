CREATE TABLE `measurement_log_channels` (
	`log_id` int NOT NULL,
	`position` int NOT NULL,
	`name` varchar(255) NOT NULL,
	`unit` enum('C','F') NOT NULL,
	`min_c` double NOT NULL,
	`max_c` double NOT NULL,
	`t_c` longblob NOT NULL,
	CONSTRAINT `measurement_log_channels_log_id_position_pk` PRIMARY KEY(`log_id`,`position`)
);
--> statement-breakpoint
CREATE TABLE `measurement_log_parts` (
	`log_id` int NOT NULL,
	`part` int NOT NULL,
	`bytes` longblob NOT NULL,
	CONSTRAINT `measurement_log_parts_log_id_part_pk` PRIMARY KEY(`log_id`,`part`)
);
--> statement-breakpoint
CREATE TABLE `measurement_logs` (
	`id` int AUTO_INCREMENT NOT NULL,
	`file_name` varchar(255) NOT NULL,
	`sha256` varchar(64) NOT NULL,
	`size_bytes` int NOT NULL,
	`rows` int NOT NULL,
	`duration_s` double NOT NULL,
	`detected` json NOT NULL,
	`mapping` json NOT NULL,
	`time_s` longblob NOT NULL,
	`batch_id` int,
	`uploaded_by` int NOT NULL,
	`uploaded_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `measurement_logs_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `measurement_log_channels` ADD CONSTRAINT `measurement_log_channels_log_id_measurement_logs_id_fk` FOREIGN KEY (`log_id`) REFERENCES `measurement_logs`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `measurement_log_parts` ADD CONSTRAINT `measurement_log_parts_log_id_measurement_logs_id_fk` FOREIGN KEY (`log_id`) REFERENCES `measurement_logs`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `measurement_logs` ADD CONSTRAINT `measurement_logs_batch_id_batches_id_fk` FOREIGN KEY (`batch_id`) REFERENCES `batches`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `measurement_logs` ADD CONSTRAINT `measurement_logs_uploaded_by_users_id_fk` FOREIGN KEY (`uploaded_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `log_batch_idx` ON `measurement_logs` (`batch_id`);--> statement-breakpoint
CREATE INDEX `log_uploaded_idx` ON `measurement_logs` (`uploaded_at`);