ALTER TABLE `users` ADD `session_version` int DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `sign_in_attempts` ADD `client` varchar(64) DEFAULT '' NOT NULL;--> statement-breakpoint
CREATE INDEX `sign_in_attempts_client_at` ON `sign_in_attempts` (`client`,`at`);--> statement-breakpoint
CREATE TABLE `rate_events` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`action` varchar(32) NOT NULL,
	`subject` varchar(320) NOT NULL,
	`at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `rate_events_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE INDEX `rate_events_action_subject_at` ON `rate_events` (`action`,`subject`,`at`);
