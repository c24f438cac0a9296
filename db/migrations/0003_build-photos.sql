CREATE TABLE `build_photos` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`build_id` bigint unsigned NOT NULL,
	`uploaded_by` bigint unsigned,
	`object_key` varchar(512) NOT NULL,
	`file_name` varchar(160) NOT NULL,
	`content_type` varchar(40) NOT NULL,
	`size_bytes` int unsigned NOT NULL,
	`caption` varchar(200),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`stored_at` datetime(3),
	CONSTRAINT `build_photos_id` PRIMARY KEY(`id`),
	CONSTRAINT `build_photos_object_key_uq` UNIQUE(`object_key`)
);
--> statement-breakpoint
ALTER TABLE `build_photos` ADD CONSTRAINT `build_photos_build_id_builds_id_fk` FOREIGN KEY (`build_id`) REFERENCES `builds`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `build_photos` ADD CONSTRAINT `build_photos_uploaded_by_users_id_fk` FOREIGN KEY (`uploaded_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `build_photos_build_idx` ON `build_photos` (`build_id`,`created_at`);