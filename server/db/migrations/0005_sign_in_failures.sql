CREATE TABLE `sign_in_failures` (
	`email` varchar(190) NOT NULL,
	`count` int NOT NULL,
	`last_at` datetime(3) NOT NULL,
	CONSTRAINT `sign_in_failures_email` PRIMARY KEY(`email`)
);
