ALTER TABLE `analyses` MODIFY COLUMN `run_id` varchar(36);--> statement-breakpoint
ALTER TABLE `analyses` ADD `kind` enum('milky-way','external-galaxy') DEFAULT 'milky-way' NOT NULL;--> statement-breakpoint
ALTER TABLE `analyses` ADD `catalog_ids` json;