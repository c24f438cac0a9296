CREATE TABLE `series_levels` (
	`run_id` bigint unsigned NOT NULL,
	`kind` enum('meta','tindex','level','raw','points','presence','track') NOT NULL,
	`bucket_size` int unsigned NOT NULL,
	`field` varchar(32) NOT NULL,
	`chunk` int unsigned NOT NULL,
	`data` longblob NOT NULL,
	CONSTRAINT `series_levels_pk` PRIMARY KEY(`run_id`,`kind`,`bucket_size`,`field`,`chunk`)
);
