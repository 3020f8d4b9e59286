CREATE TABLE `api_tokens` (
	`id` varchar(36) NOT NULL,
	`user_id` varchar(36) NOT NULL,
	`name` varchar(120) NOT NULL,
	`token_hash` varchar(64) NOT NULL,
	`prefix` varchar(16) NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`last_used_at` timestamp,
	`revoked_at` timestamp,
	CONSTRAINT `api_tokens_id` PRIMARY KEY(`id`),
	CONSTRAINT `api_tokens_token_hash_unique` UNIQUE(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `audit_log` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`project_id` varchar(36),
	`user_id` varchar(36),
	`action` varchar(64) NOT NULL,
	`subject` varchar(128),
	`detail` json,
	`at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `audit_log_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `catalog_rejects` (
	`catalog_id` varchar(36) NOT NULL,
	`line` int NOT NULL,
	`reason` varchar(500) NOT NULL,
	CONSTRAINT `catalog_rejects_catalog_id_line_pk` PRIMARY KEY(`catalog_id`,`line`)
);
--> statement-breakpoint
CREATE TABLE `catalog_rows` (
	`catalog_id` varchar(36) NOT NULL,
	`row` int NOT NULL,
	`line` int NOT NULL,
	`name` varchar(128),
	`l` double NOT NULL,
	`b` double NOT NULL,
	`v` double,
	`radius_arcsec` double,
	`pos_err_arcsec` double,
	`v_err_kms` double,
	`line_width_kms` double,
	`dist_kpc` double,
	`dist_err_kpc` double,
	`original` json,
	CONSTRAINT `catalog_rows_catalog_id_row_pk` PRIMARY KEY(`catalog_id`,`row`)
);
--> statement-breakpoint
CREATE TABLE `catalogs` (
	`id` varchar(36) NOT NULL,
	`project_id` varchar(36) NOT NULL,
	`name` varchar(200) NOT NULL,
	`kind` enum('hi','co','hii','ob','other') NOT NULL,
	`status` enum('queued','ingesting','ready','failed') NOT NULL DEFAULT 'queued',
	`progress` double NOT NULL DEFAULT 0,
	`row_count` int NOT NULL DEFAULT 0,
	`rejected_count` int NOT NULL DEFAULT 0,
	`error` text,
	`file_name` varchar(255) NOT NULL,
	`file_path` varchar(500) NOT NULL,
	`file_bytes` bigint unsigned NOT NULL,
	`format` varchar(16),
	`policy` enum('skip-bad-rows','reject-file') NOT NULL DEFAULT 'skip-bad-rows',
	`mapping` json,
	`columns` json,
	`job_id` bigint unsigned,
	`created_by` varchar(36),
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`ready_at` timestamp(3),
	CONSTRAINT `catalogs_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `invitations` (
	`id` varchar(36) NOT NULL,
	`project_id` varchar(36) NOT NULL,
	`email` varchar(254) NOT NULL,
	`role` enum('owner','editor','viewer') NOT NULL,
	`token_hash` varchar(64) NOT NULL,
	`invited_by` varchar(36),
	`expires_at` timestamp NOT NULL,
	`accepted_at` timestamp,
	`accepted_by` varchar(36),
	`revoked_at` timestamp,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `invitations_id` PRIMARY KEY(`id`),
	CONSTRAINT `invitations_token_hash_unique` UNIQUE(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `jobs` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`kind` varchar(32) NOT NULL,
	`project_id` varchar(36),
	`payload` json NOT NULL,
	`status` enum('queued','running','done','failed','cancelled') NOT NULL DEFAULT 'queued',
	`progress` double NOT NULL DEFAULT 0,
	`attempts` int NOT NULL DEFAULT 0,
	`error` text,
	`locked_by` varchar(64),
	`heartbeat_at` timestamp(3),
	`cancel_requested` boolean NOT NULL DEFAULT false,
	`created_by` varchar(36),
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`started_at` timestamp(3),
	`finished_at` timestamp(3),
	CONSTRAINT `jobs_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `password_resets` (
	`token_hash` varchar(64) NOT NULL,
	`user_id` varchar(36) NOT NULL,
	`expires_at` timestamp NOT NULL,
	`used_at` timestamp,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `password_resets_token_hash` PRIMARY KEY(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `project_members` (
	`project_id` varchar(36) NOT NULL,
	`user_id` varchar(36) NOT NULL,
	`role` enum('owner','editor','viewer') NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `project_members_project_id_user_id_pk` PRIMARY KEY(`project_id`,`user_id`)
);
--> statement-breakpoint
CREATE TABLE `projects` (
	`id` varchar(36) NOT NULL,
	`name` varchar(200) NOT NULL,
	`description` text,
	`settings` json NOT NULL DEFAULT ('{}'),
	`created_by` varchar(36),
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `projects_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `sign_in_attempts` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`email` varchar(254) NOT NULL,
	`succeeded` boolean NOT NULL,
	`at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `sign_in_attempts_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `users` (
	`id` varchar(36) NOT NULL,
	`email` varchar(254) NOT NULL,
	`name` varchar(120) NOT NULL,
	`password_hash` varchar(100) NOT NULL,
	`site_role` enum('admin','member') NOT NULL DEFAULT 'member',
	`notify_run_emails` boolean NOT NULL DEFAULT true,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `users_id` PRIMARY KEY(`id`),
	CONSTRAINT `users_email_unique` UNIQUE(`email`)
);
--> statement-breakpoint
ALTER TABLE `api_tokens` ADD CONSTRAINT `api_tokens_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `audit_log` ADD CONSTRAINT `audit_log_project_id_projects_id_fk` FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `audit_log` ADD CONSTRAINT `audit_log_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `catalog_rejects` ADD CONSTRAINT `catalog_rejects_catalog_id_catalogs_id_fk` FOREIGN KEY (`catalog_id`) REFERENCES `catalogs`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `catalogs` ADD CONSTRAINT `catalogs_project_id_projects_id_fk` FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `catalogs` ADD CONSTRAINT `catalogs_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `invitations` ADD CONSTRAINT `invitations_project_id_projects_id_fk` FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `invitations` ADD CONSTRAINT `invitations_invited_by_users_id_fk` FOREIGN KEY (`invited_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `invitations` ADD CONSTRAINT `invitations_accepted_by_users_id_fk` FOREIGN KEY (`accepted_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `jobs` ADD CONSTRAINT `jobs_project_id_projects_id_fk` FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `jobs` ADD CONSTRAINT `jobs_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `password_resets` ADD CONSTRAINT `password_resets_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `project_members` ADD CONSTRAINT `project_members_project_id_projects_id_fk` FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `project_members` ADD CONSTRAINT `project_members_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `projects` ADD CONSTRAINT `projects_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `api_tokens_user` ON `api_tokens` (`user_id`);--> statement-breakpoint
CREATE INDEX `audit_project_at` ON `audit_log` (`project_id`,`at`);--> statement-breakpoint
CREATE INDEX `rows_l` ON `catalog_rows` (`catalog_id`,`l`);--> statement-breakpoint
CREATE INDEX `rows_b` ON `catalog_rows` (`catalog_id`,`b`);--> statement-breakpoint
CREATE INDEX `rows_v` ON `catalog_rows` (`catalog_id`,`v`);--> statement-breakpoint
CREATE INDEX `rows_name` ON `catalog_rows` (`catalog_id`,`name`);--> statement-breakpoint
CREATE INDEX `rows_radius` ON `catalog_rows` (`catalog_id`,`radius_arcsec`);--> statement-breakpoint
CREATE INDEX `rows_line_width` ON `catalog_rows` (`catalog_id`,`line_width_kms`);--> statement-breakpoint
CREATE INDEX `rows_dist` ON `catalog_rows` (`catalog_id`,`dist_kpc`);--> statement-breakpoint
CREATE INDEX `catalogs_project` ON `catalogs` (`project_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `invitations_project` ON `invitations` (`project_id`);--> statement-breakpoint
CREATE INDEX `jobs_status_created` ON `jobs` (`status`,`created_at`);--> statement-breakpoint
CREATE INDEX `members_user` ON `project_members` (`user_id`);--> statement-breakpoint
CREATE INDEX `sign_in_attempts_email_at` ON `sign_in_attempts` (`email`,`at`);