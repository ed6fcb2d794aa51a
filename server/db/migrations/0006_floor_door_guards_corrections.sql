CREATE TABLE `batch_event_corrections` (
	`id` int AUTO_INCREMENT NOT NULL,
	`event_id` int NOT NULL,
	`batch_id` int NOT NULL,
	`corrected_at` datetime(3) NOT NULL,
	`reason` varchar(500) NOT NULL,
	`actor_id` int NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `batch_event_corrections_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `batch_events` MODIFY COLUMN `from_state` enum('planned','charged','soaking','unloaded','quenched','cooling','ready','released','cancelled') NOT NULL;--> statement-breakpoint
ALTER TABLE `batch_events` MODIFY COLUMN `to_state` enum('planned','charged','soaking','unloaded','quenched','cooling','ready','released','cancelled') NOT NULL;--> statement-breakpoint
ALTER TABLE `batches` MODIFY COLUMN `state` enum('planned','charged','soaking','unloaded','quenched','cooling','ready','released','cancelled') NOT NULL DEFAULT 'planned';--> statement-breakpoint
ALTER TABLE `batch_events` ADD `shortfall_s` double;--> statement-breakpoint
ALTER TABLE `batch_events` ADD `shortfall_note` varchar(300);--> statement-breakpoint
ALTER TABLE `batches` ADD `unloaded_at` datetime(3);--> statement-breakpoint
ALTER TABLE `batch_event_corrections` ADD CONSTRAINT `batch_event_corrections_event_id_batch_events_id_fk` FOREIGN KEY (`event_id`) REFERENCES `batch_events`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `batch_event_corrections` ADD CONSTRAINT `batch_event_corrections_batch_id_batches_id_fk` FOREIGN KEY (`batch_id`) REFERENCES `batches`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `batch_event_corrections` ADD CONSTRAINT `batch_event_corrections_actor_id_users_id_fk` FOREIGN KEY (`actor_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `correction_batch_idx` ON `batch_event_corrections` (`batch_id`);