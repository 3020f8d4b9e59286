ALTER TABLE `catalogs` ADD `archived_at` timestamp(3);--> statement-breakpoint
ALTER TABLE `link_runs` ADD `note` text;--> statement-breakpoint
ALTER TABLE `link_runs` ADD `archived_at` timestamp(3);--> statement-breakpoint
ALTER TABLE `analyses` ADD `name` varchar(200);--> statement-breakpoint
ALTER TABLE `analyses` ADD `note` text;--> statement-breakpoint
ALTER TABLE `analyses` ADD `archived_at` timestamp(3);
