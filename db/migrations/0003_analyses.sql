CREATE TABLE `analyses` (
	`id` varchar(36) NOT NULL,
	`project_id` varchar(36) NOT NULL,
	`run_id` varchar(36) NOT NULL,
	`status` enum('queued','running','done','failed','cancelled') NOT NULL DEFAULT 'queued',
	`progress` double NOT NULL DEFAULT 0,
	`params` json NOT NULL,
	`result` json,
	`error` text,
	`job_id` bigint unsigned,
	`created_by` varchar(36),
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`finished_at` timestamp(3),
	CONSTRAINT `analyses_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `distance_overrides` (
	`run_id` varchar(36) NOT NULL,
	`complex_id` int NOT NULL,
	`dist_kpc` double NOT NULL,
	`note` text,
	`set_by` varchar(36),
	`set_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `distance_overrides_run_id_complex_id_pk` PRIMARY KEY(`run_id`,`complex_id`)
);
--> statement-breakpoint
ALTER TABLE `analyses` ADD CONSTRAINT `analyses_project_id_projects_id_fk` FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `analyses` ADD CONSTRAINT `analyses_run_id_link_runs_id_fk` FOREIGN KEY (`run_id`) REFERENCES `link_runs`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `analyses` ADD CONSTRAINT `analyses_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `distance_overrides` ADD CONSTRAINT `distance_overrides_run_id_link_runs_id_fk` FOREIGN KEY (`run_id`) REFERENCES `link_runs`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `distance_overrides` ADD CONSTRAINT `distance_overrides_set_by_users_id_fk` FOREIGN KEY (`set_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `analyses_project` ON `analyses` (`project_id`,`created_at`);