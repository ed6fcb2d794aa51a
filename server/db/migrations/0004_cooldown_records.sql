CREATE TABLE `cooldown_records` (
	`id` int AUTO_INCREMENT NOT NULL,
	`batch_id` int NOT NULL,
	`snapshot` json NOT NULL,
	`hash` varchar(64) NOT NULL,
	`deviation_count` int NOT NULL,
	`released_at` datetime(3) NOT NULL,
	`state` enum('unsigned','approved','rejected') NOT NULL DEFAULT 'unsigned',
	`signed_by` int,
	`signed_at` datetime(3),
	`sign_comment` text,
	`signature_hash` varchar(64),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `cooldown_records_id` PRIMARY KEY(`id`),
	CONSTRAINT `cooldown_records_batch_id_unique` UNIQUE(`batch_id`)
);
--> statement-breakpoint
ALTER TABLE `cooldown_records` ADD CONSTRAINT `cooldown_records_batch_id_batches_id_fk` FOREIGN KEY (`batch_id`) REFERENCES `batches`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cooldown_records` ADD CONSTRAINT `cooldown_records_signed_by_users_id_fk` FOREIGN KEY (`signed_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `record_state_idx` ON `cooldown_records` (`state`,`created_at`);--> statement-breakpoint
CREATE INDEX `record_released_idx` ON `cooldown_records` (`released_at`);