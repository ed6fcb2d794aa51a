CREATE TABLE `mail_recipients` (
	`kind` enum('released_sheet','rejection','daily_digest') NOT NULL,
	`emails` json NOT NULL,
	`include_role_default` boolean NOT NULL DEFAULT true,
	`updated_by` int,
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `mail_recipients_kind` PRIMARY KEY(`kind`)
);
--> statement-breakpoint
CREATE TABLE `outbox_messages` (
	`id` int AUTO_INCREMENT NOT NULL,
	`dedupe_key` varchar(190) NOT NULL,
	`to_addresses` json NOT NULL,
	`subject` varchar(255) NOT NULL,
	`html` mediumtext NOT NULL,
	`text` mediumtext NOT NULL,
	`attachments` json NOT NULL,
	`status` enum('queued','sending','sent','failed') NOT NULL DEFAULT 'queued',
	`attempts` int NOT NULL DEFAULT 0,
	`next_attempt_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`claim_token` varchar(36),
	`last_error` text,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`sent_at` datetime(3),
	CONSTRAINT `outbox_messages_id` PRIMARY KEY(`id`),
	CONSTRAINT `outbox_messages_dedupe_key_unique` UNIQUE(`dedupe_key`)
);
--> statement-breakpoint
ALTER TABLE `mail_recipients` ADD CONSTRAINT `mail_recipients_updated_by_users_id_fk` FOREIGN KEY (`updated_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `outbox_due_idx` ON `outbox_messages` (`status`,`next_attempt_at`);