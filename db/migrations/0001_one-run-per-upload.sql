ALTER TABLE `runs` ADD CONSTRAINT `runs_upload_uq` UNIQUE(`upload_id`);--> statement-breakpoint
DROP INDEX `runs_upload_idx` ON `runs`;
