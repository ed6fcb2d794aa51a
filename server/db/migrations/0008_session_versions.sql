CREATE TABLE `sign_in_attempts` (
	`subject` varchar(200) NOT NULL,
	`count` int NOT NULL,
	`last_at` datetime(3) NOT NULL,
	CONSTRAINT `sign_in_attempts_subject` PRIMARY KEY(`subject`)
);
--> statement-breakpoint
DROP TABLE `sign_in_failures`;--> statement-breakpoint
ALTER TABLE `users` ADD `session_version` int DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `users` ADD `must_change_password` boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE `users` ADD `demo` boolean DEFAULT false NOT NULL;--> statement-breakpoint
-- The four published demo sign-ins of earlier installs become demo accounts (loopback only).
UPDATE `users` SET `demo` = true WHERE `email` IN ('admin@kestrelbay.example', 'metallurgist@kestrelbay.example', 'operator@kestrelbay.example', 'qa@kestrelbay.example');
