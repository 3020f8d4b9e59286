CREATE TABLE `analysis_complexes` (
	`analysis_id` varchar(36) NOT NULL,
	`run_id` varchar(36) NOT NULL,
	`complex_id` int NOT NULL,
	`dist_kpc` double,
	`dist_lo_kpc` double,
	`dist_hi_kpc` double,
	`dist_ci95_lo_kpc` double,
	`dist_ci95_hi_kpc` double,
	`p_near` double,
	`distance_choice` varchar(16) NOT NULL,
	`arm` varchar(64),
	`perp_offset_kpc` double,
	`used` boolean NOT NULL,
	CONSTRAINT `analysis_complexes_analysis_id_complex_id_pk` PRIMARY KEY(`analysis_id`,`complex_id`)
);
--> statement-breakpoint
ALTER TABLE `analysis_complexes` ADD CONSTRAINT `analysis_complexes_analysis_id_analyses_id_fk` FOREIGN KEY (`analysis_id`) REFERENCES `analyses`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `analysis_complexes_run` ON `analysis_complexes` (`run_id`,`complex_id`);