CREATE TABLE `quenchant_calibrations` (
	`id` int AUTO_INCREMENT NOT NULL,
	`quenchant_id` int NOT NULL,
	`log_id` int NOT NULL,
	`channel` varchar(255) NOT NULL,
	`probe` json NOT NULL,
	`bath_c` double NOT NULL,
	`initial_c` double NOT NULL,
	`from_s` double NOT NULL,
	`to_s` double NOT NULL,
	`model` enum('constant','curve') NOT NULL,
	`fitted` json NOT NULL,
	`rms_k` double NOT NULL,
	`max_abs_k` double NOT NULL,
	`points` int NOT NULL,
	`iterations` int NOT NULL,
	`curves` json NOT NULL,
	`created_by` int NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `quenchant_calibrations_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `quenchant_calibrations` ADD CONSTRAINT `quenchant_calibrations_quenchant_id_quenchants_id_fk` FOREIGN KEY (`quenchant_id`) REFERENCES `quenchants`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `quenchant_calibrations` ADD CONSTRAINT `quenchant_calibrations_log_id_measurement_logs_id_fk` FOREIGN KEY (`log_id`) REFERENCES `measurement_logs`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `quenchant_calibrations` ADD CONSTRAINT `quenchant_calibrations_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `calibration_quenchant_idx` ON `quenchant_calibrations` (`quenchant_id`,`created_at`);