CREATE TABLE `revoked_sessions` (
	`sid` char(32) NOT NULL,
	`user_id` bigint unsigned NOT NULL,
	`expires_at` datetime(3) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `revoked_sessions_sid` PRIMARY KEY(`sid`)
);
--> statement-breakpoint
CREATE TABLE `ingest_jobs` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`run_id` bigint unsigned NOT NULL,
	`state` enum('queued','running','done','failed') NOT NULL DEFAULT 'queued',
	`attempts` smallint unsigned NOT NULL DEFAULT 0,
	`retries` smallint unsigned NOT NULL DEFAULT 0,
	`available_at` datetime(3) NOT NULL,
	`claimed_by` varchar(100),
	`heartbeat_at` datetime(3),
	`last_error` text,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `ingest_jobs_id` PRIMARY KEY(`id`),
	CONSTRAINT `ingest_jobs_run_uq` UNIQUE(`run_id`)
);
--> statement-breakpoint
CREATE TABLE `mail_outbox` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`to_address` varchar(254) NOT NULL,
	`subject` varchar(300) NOT NULL,
	`text_body` mediumtext NOT NULL,
	`html_body` mediumtext NOT NULL,
	`kind` varchar(40) NOT NULL,
	`state` enum('pending','sent','failed') NOT NULL DEFAULT 'pending',
	`attempts` smallint unsigned NOT NULL DEFAULT 0,
	`next_attempt_at` datetime(3) NOT NULL,
	`last_error` text,
	`sent_at` datetime(3),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `mail_outbox_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `users` ADD `sessions_valid_after` datetime(3);--> statement-breakpoint
ALTER TABLE `revoked_sessions` ADD CONSTRAINT `revoked_sessions_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ingest_jobs` ADD CONSTRAINT `ingest_jobs_run_id_runs_id_fk` FOREIGN KEY (`run_id`) REFERENCES `runs`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `ingest_jobs_state_available_idx` ON `ingest_jobs` (`state`,`available_at`);--> statement-breakpoint
CREATE INDEX `mail_outbox_state_next_idx` ON `mail_outbox` (`state`,`next_attempt_at`);--> statement-breakpoint
CREATE INDEX `runs_status_idx` ON `runs` (`status`);