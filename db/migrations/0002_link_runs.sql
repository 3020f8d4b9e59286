CREATE TABLE `complex_members` (
	`run_id` varchar(36) NOT NULL,
	`complex_id` int NOT NULL,
	`catalog_id` varchar(36) NOT NULL,
	`row` int NOT NULL,
	`name` varchar(128),
	CONSTRAINT `complex_members_run_id_complex_id_catalog_id_row_pk` PRIMARY KEY(`run_id`,`complex_id`,`catalog_id`,`row`)
);
--> statement-breakpoint
CREATE TABLE `complexes` (
	`run_id` varchar(36) NOT NULL,
	`id` int NOT NULL,
	`size` int NOT NULL,
	`link_count` int NOT NULL,
	`n_hi` int NOT NULL,
	`n_co` int NOT NULL,
	`n_hii` int NOT NULL,
	`n_ob` int NOT NULL,
	`n_other` int NOT NULL,
	`l` double NOT NULL,
	`b` double NOT NULL,
	`v` double,
	`max_sep_arcsec` double NOT NULL,
	`max_dv_kms` double,
	`reliability` double,
	`over_cap` boolean NOT NULL,
	`name` varchar(128),
	`review` enum('accepted','doubtful','rejected'),
	`review_note` text,
	`reviewed_by` varchar(36),
	`reviewed_at` timestamp(3),
	CONSTRAINT `complexes_run_id_id_pk` PRIMARY KEY(`run_id`,`id`)
);
--> statement-breakpoint
CREATE TABLE `link_runs` (
	`id` varchar(36) NOT NULL,
	`project_id` varchar(36) NOT NULL,
	`name` varchar(200) NOT NULL,
	`status` enum('queued','running','done','failed','cancelled') NOT NULL DEFAULT 'queued',
	`progress` double NOT NULL DEFAULT 0,
	`params` json NOT NULL,
	`catalog_ids` json NOT NULL,
	`summary` json,
	`error` text,
	`job_id` bigint unsigned,
	`created_by` varchar(36),
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`started_at` timestamp(3),
	`finished_at` timestamp(3),
	CONSTRAINT `link_runs_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `links` (
	`run_id` varchar(36) NOT NULL,
	`id` int NOT NULL,
	`catalog_a` varchar(36) NOT NULL,
	`row_a` int NOT NULL,
	`catalog_b` varchar(36) NOT NULL,
	`row_b` int NOT NULL,
	`sep_arcsec` double NOT NULL,
	`dv_kms` double,
	`radius_arcsec` double NOT NULL,
	`reliability` double,
	`complex_id` int NOT NULL,
	CONSTRAINT `links_run_id_id_pk` PRIMARY KEY(`run_id`,`id`)
);
--> statement-breakpoint
ALTER TABLE `link_runs` ADD CONSTRAINT `link_runs_project_id_projects_id_fk` FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `link_runs` ADD CONSTRAINT `link_runs_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `members_source` ON `complex_members` (`run_id`,`catalog_id`,`row`);--> statement-breakpoint
CREATE INDEX `members_name` ON `complex_members` (`run_id`,`name`);--> statement-breakpoint
CREATE INDEX `complexes_size` ON `complexes` (`run_id`,`size`);--> statement-breakpoint
CREATE INDEX `complexes_l` ON `complexes` (`run_id`,`l`);--> statement-breakpoint
CREATE INDEX `complexes_b` ON `complexes` (`run_id`,`b`);--> statement-breakpoint
CREATE INDEX `complexes_v` ON `complexes` (`run_id`,`v`);--> statement-breakpoint
CREATE INDEX `complexes_sep` ON `complexes` (`run_id`,`max_sep_arcsec`);--> statement-breakpoint
CREATE INDEX `complexes_dv` ON `complexes` (`run_id`,`max_dv_kms`);--> statement-breakpoint
CREATE INDEX `complexes_rel` ON `complexes` (`run_id`,`reliability`);--> statement-breakpoint
CREATE INDEX `complexes_review` ON `complexes` (`run_id`,`review`);--> statement-breakpoint
CREATE INDEX `link_runs_project` ON `link_runs` (`project_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `links_complex` ON `links` (`run_id`,`complex_id`);