ALTER TABLE `measurement_logs` ADD `started_at` datetime(3);--> statement-breakpoint
ALTER TABLE `measurement_logs` ADD `quench_at_log_s` double;