ALTER TABLE `runs` ADD `part` smallint unsigned DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_upload_part_uq` UNIQUE(`upload_id`,`part`);--> statement-breakpoint
ALTER TABLE `runs` DROP INDEX `runs_upload_uq`;