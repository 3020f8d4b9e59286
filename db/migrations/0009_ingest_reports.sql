ALTER TABLE `catalogs` ADD `decimal_comma` boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE `catalogs` ADD `assumptions` json;--> statement-breakpoint
ALTER TABLE `catalogs` ADD `data_row_count` int;
