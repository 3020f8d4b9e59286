CREATE INDEX `links_key` ON `links` (`run_id`,`catalog_a`,`row_a`,`catalog_b`,`row_b`);
