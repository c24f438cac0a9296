CREATE TABLE `api_tokens` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`user_id` bigint unsigned NOT NULL,
	`name` varchar(80) NOT NULL,
	`token_prefix` varchar(16) NOT NULL,
	`token_hash` char(64) NOT NULL,
	`last_used_at` datetime(3),
	`revoked_at` datetime(3),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `api_tokens_id` PRIMARY KEY(`id`),
	CONSTRAINT `api_tokens_token_uq` UNIQUE(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `login_attempts` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`email` varchar(254) NOT NULL,
	`ip` varchar(64) NOT NULL,
	`succeeded` boolean NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `login_attempts_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `password_resets` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`user_id` bigint unsigned NOT NULL,
	`token_hash` char(64) NOT NULL,
	`expires_at` datetime(3) NOT NULL,
	`used_at` datetime(3),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `password_resets_id` PRIMARY KEY(`id`),
	CONSTRAINT `password_resets_token_uq` UNIQUE(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `users` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`email` varchar(254) NOT NULL,
	`name` varchar(120) NOT NULL,
	`password_hash` varchar(100) NOT NULL,
	`units` enum('metric','imperial') NOT NULL DEFAULT 'metric',
	`alert_emails` boolean NOT NULL DEFAULT true,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `users_id` PRIMARY KEY(`id`),
	CONSTRAINT `users_email_uq` UNIQUE(`email`)
);
--> statement-breakpoint
CREATE TABLE `crews` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`name` varchar(120) NOT NULL,
	`thresholds` json,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `crews_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `invitations` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`crew_id` bigint unsigned NOT NULL,
	`email` varchar(254) NOT NULL,
	`role` enum('lead','pilot','observer') NOT NULL,
	`token_hash` char(64) NOT NULL,
	`invited_by` bigint unsigned,
	`expires_at` datetime(3) NOT NULL,
	`accepted_at` datetime(3),
	`accepted_by` bigint unsigned,
	`revoked_at` datetime(3),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `invitations_id` PRIMARY KEY(`id`),
	CONSTRAINT `invitations_token_uq` UNIQUE(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `memberships` (
	`crew_id` bigint unsigned NOT NULL,
	`user_id` bigint unsigned NOT NULL,
	`role` enum('lead','pilot','observer') NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `memberships_pk` PRIMARY KEY(`crew_id`,`user_id`)
);
--> statement-breakpoint
CREATE TABLE `build_changes` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`build_id` bigint unsigned NOT NULL,
	`changed_by` bigint unsigned,
	`changes` json NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `build_changes_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `build_channels` (
	`build_id` bigint unsigned NOT NULL,
	`channel` tinyint unsigned NOT NULL,
	`function` enum('roll','pitch','throttle','yaw','arm','return-to-home','mission','mode','rssi','aux','unused') NOT NULL DEFAULT 'unused',
	`switch_label` varchar(40),
	`positions` tinyint unsigned,
	`engage_min_us` smallint unsigned,
	`engage_max_us` smallint unsigned,
	`failsafe_us` smallint unsigned,
	CONSTRAINT `build_channels_pk` PRIMARY KEY(`build_id`,`channel`)
);
--> statement-breakpoint
CREATE TABLE `builds` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`crew_id` bigint unsigned NOT NULL,
	`name` varchar(120) NOT NULL,
	`vehicle_type` enum('ground','multirotor','fixed-wing','boat') NOT NULL,
	`frame` varchar(120),
	`flight_controller` varchar(120),
	`firmware` varchar(120),
	`firmware_version` varchar(60),
	`receiver` varchar(120),
	`transmitter` varchar(120),
	`band_mhz` double,
	`tx_power_mw` float,
	`rx_sensitivity_dbm` float,
	`antennas` varchar(200),
	`battery_cells` tinyint unsigned,
	`battery_capacity_mah` int unsigned,
	`notes` text,
	`failsafe_action` enum('return-to-home','hold','land'),
	`failsafe_within_s` float,
	`thresholds` json,
	`retired_at` datetime(3),
	`created_by` bigint unsigned,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `builds_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `route_plans` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`crew_id` bigint unsigned NOT NULL,
	`name` varchar(120) NOT NULL,
	`vehicle_class` enum('ground','air') NOT NULL DEFAULT 'ground',
	`corridor_m` float,
	`source` enum('gpx','json','drawn') NOT NULL,
	`created_by` bigint unsigned,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `route_plans_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `route_waypoints` (
	`route_plan_id` bigint unsigned NOT NULL,
	`seq` int unsigned NOT NULL,
	`name` varchar(80) NOT NULL,
	`lat` double NOT NULL,
	`lon` double NOT NULL,
	`alt_m` float,
	`radius_m` float,
	CONSTRAINT `route_waypoints_pk` PRIMARY KEY(`route_plan_id`,`seq`)
);
--> statement-breakpoint
CREATE TABLE `uploads` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`crew_id` bigint unsigned NOT NULL,
	`uploaded_by` bigint unsigned,
	`file_name` varchar(255) NOT NULL,
	`size_bytes` bigint unsigned NOT NULL,
	`content_type` varchar(120) NOT NULL,
	`object_key` varchar(512) NOT NULL,
	`sha256` char(64),
	`status` enum('pending','stored','failed') NOT NULL DEFAULT 'pending',
	`multipart_upload_id` varchar(255),
	`build_id` bigint unsigned,
	`route_plan_id` bigint unsigned,
	`note` text,
	`error` text,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`stored_at` datetime(3),
	CONSTRAINT `uploads_id` PRIMARY KEY(`id`),
	CONSTRAINT `uploads_object_key_uq` UNIQUE(`object_key`)
);
--> statement-breakpoint
CREATE TABLE `events` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`run_id` bigint unsigned NOT NULL,
	`kind` enum('link-fade','link-lost','failsafe','return-to-home','off-route','waypoint-reached','waypoint-missed','fix-lost','position-jump','low-voltage','armed','disarmed') NOT NULL,
	`start_s` double NOT NULL,
	`end_s` double NOT NULL,
	`lat` double,
	`lon` double,
	`distance_from_home_m` double,
	`peak` double,
	`threshold` double,
	`detail` json,
	CONSTRAINT `events_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `run_notes` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`run_id` bigint unsigned NOT NULL,
	`author_id` bigint unsigned,
	`body` text NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `run_notes_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `runs` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`crew_id` bigint unsigned NOT NULL,
	`upload_id` bigint unsigned NOT NULL,
	`build_id` bigint unsigned,
	`route_plan_id` bigint unsigned,
	`pilot_id` bigint unsigned,
	`title` varchar(160) NOT NULL,
	`format` enum('csv','gpx','nmea'),
	`status` enum('queued','parsing','analysing','ready','failed') NOT NULL DEFAULT 'queued',
	`progress` float NOT NULL DEFAULT 0,
	`error` text,
	`warnings` json,
	`column_map` json,
	`sample_count` int unsigned NOT NULL DEFAULT 0,
	`started_at` datetime(3),
	`duration_s` double,
	`distance_m` double,
	`verdict` enum('clear','watch','act'),
	`summary` json,
	`mode_names` json,
	`signed_off_by` bigint unsigned,
	`signed_off_at` datetime(3),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `runs_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `samples` (
	`run_id` bigint unsigned NOT NULL,
	`seq` int unsigned NOT NULL,
	`t_s` double NOT NULL,
	`lat` double,
	`lon` double,
	`alt_m` float,
	`speed_mps` float,
	`heading_deg` float,
	`sats` tinyint unsigned,
	`hdop` float,
	`fix_type` tinyint unsigned,
	`rssi_dbm` float,
	`rssi_pct` float,
	`lq_pct` float,
	`snr_db` float,
	`voltage_v` float,
	`current_a` float,
	`used_mah` float,
	`mode_index` smallint unsigned,
	`armed` boolean,
	`failsafe` boolean,
	`rc` varbinary(36),
	CONSTRAINT `samples_pk` PRIMARY KEY(`run_id`,`seq`)
);
--> statement-breakpoint
CREATE TABLE `column_maps` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`crew_id` bigint unsigned NOT NULL,
	`name` varchar(80) NOT NULL,
	`mapping` json NOT NULL,
	`created_by` bigint unsigned,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `column_maps_id` PRIMARY KEY(`id`),
	CONSTRAINT `column_maps_crew_name_uq` UNIQUE(`crew_id`,`name`)
);
--> statement-breakpoint
CREATE TABLE `share_links` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`run_id` bigint unsigned NOT NULL,
	`token_hash` char(64) NOT NULL,
	`created_by` bigint unsigned,
	`expires_at` datetime(3) NOT NULL,
	`revoked_at` datetime(3),
	`view_count` int unsigned NOT NULL DEFAULT 0,
	`last_viewed_at` datetime(3),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `share_links_id` PRIMARY KEY(`id`),
	CONSTRAINT `share_links_token_uq` UNIQUE(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `audit_log` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`crew_id` bigint unsigned,
	`actor_id` bigint unsigned,
	`action` varchar(64) NOT NULL,
	`target_type` varchar(40),
	`target_id` varchar(64),
	`detail` json,
	`ip` varchar(64),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `audit_log_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `api_tokens` ADD CONSTRAINT `api_tokens_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `password_resets` ADD CONSTRAINT `password_resets_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `invitations` ADD CONSTRAINT `invitations_crew_id_crews_id_fk` FOREIGN KEY (`crew_id`) REFERENCES `crews`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `invitations` ADD CONSTRAINT `invitations_invited_by_users_id_fk` FOREIGN KEY (`invited_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `invitations` ADD CONSTRAINT `invitations_accepted_by_users_id_fk` FOREIGN KEY (`accepted_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `memberships` ADD CONSTRAINT `memberships_crew_id_crews_id_fk` FOREIGN KEY (`crew_id`) REFERENCES `crews`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `memberships` ADD CONSTRAINT `memberships_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `build_changes` ADD CONSTRAINT `build_changes_build_id_builds_id_fk` FOREIGN KEY (`build_id`) REFERENCES `builds`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `build_changes` ADD CONSTRAINT `build_changes_changed_by_users_id_fk` FOREIGN KEY (`changed_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `build_channels` ADD CONSTRAINT `build_channels_build_id_builds_id_fk` FOREIGN KEY (`build_id`) REFERENCES `builds`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `builds` ADD CONSTRAINT `builds_crew_id_crews_id_fk` FOREIGN KEY (`crew_id`) REFERENCES `crews`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `builds` ADD CONSTRAINT `builds_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `route_plans` ADD CONSTRAINT `route_plans_crew_id_crews_id_fk` FOREIGN KEY (`crew_id`) REFERENCES `crews`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `route_plans` ADD CONSTRAINT `route_plans_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `route_waypoints` ADD CONSTRAINT `route_waypoints_route_plan_id_route_plans_id_fk` FOREIGN KEY (`route_plan_id`) REFERENCES `route_plans`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `uploads` ADD CONSTRAINT `uploads_crew_id_crews_id_fk` FOREIGN KEY (`crew_id`) REFERENCES `crews`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `uploads` ADD CONSTRAINT `uploads_uploaded_by_users_id_fk` FOREIGN KEY (`uploaded_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `uploads` ADD CONSTRAINT `uploads_build_id_builds_id_fk` FOREIGN KEY (`build_id`) REFERENCES `builds`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `uploads` ADD CONSTRAINT `uploads_route_plan_id_route_plans_id_fk` FOREIGN KEY (`route_plan_id`) REFERENCES `route_plans`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `events` ADD CONSTRAINT `events_run_id_runs_id_fk` FOREIGN KEY (`run_id`) REFERENCES `runs`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `run_notes` ADD CONSTRAINT `run_notes_run_id_runs_id_fk` FOREIGN KEY (`run_id`) REFERENCES `runs`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `run_notes` ADD CONSTRAINT `run_notes_author_id_users_id_fk` FOREIGN KEY (`author_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_crew_id_crews_id_fk` FOREIGN KEY (`crew_id`) REFERENCES `crews`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_upload_id_uploads_id_fk` FOREIGN KEY (`upload_id`) REFERENCES `uploads`(`id`) ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_build_id_builds_id_fk` FOREIGN KEY (`build_id`) REFERENCES `builds`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_route_plan_id_route_plans_id_fk` FOREIGN KEY (`route_plan_id`) REFERENCES `route_plans`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_pilot_id_users_id_fk` FOREIGN KEY (`pilot_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_signed_off_by_users_id_fk` FOREIGN KEY (`signed_off_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `column_maps` ADD CONSTRAINT `column_maps_crew_id_crews_id_fk` FOREIGN KEY (`crew_id`) REFERENCES `crews`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `column_maps` ADD CONSTRAINT `column_maps_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `share_links` ADD CONSTRAINT `share_links_run_id_runs_id_fk` FOREIGN KEY (`run_id`) REFERENCES `runs`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `share_links` ADD CONSTRAINT `share_links_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `audit_log` ADD CONSTRAINT `audit_log_crew_id_crews_id_fk` FOREIGN KEY (`crew_id`) REFERENCES `crews`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `audit_log` ADD CONSTRAINT `audit_log_actor_id_users_id_fk` FOREIGN KEY (`actor_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `api_tokens_user_idx` ON `api_tokens` (`user_id`);--> statement-breakpoint
CREATE INDEX `login_attempts_email_created_idx` ON `login_attempts` (`email`,`created_at`);--> statement-breakpoint
CREATE INDEX `login_attempts_ip_created_idx` ON `login_attempts` (`ip`,`created_at`);--> statement-breakpoint
CREATE INDEX `password_resets_user_idx` ON `password_resets` (`user_id`);--> statement-breakpoint
CREATE INDEX `invitations_crew_idx` ON `invitations` (`crew_id`);--> statement-breakpoint
CREATE INDEX `invitations_email_idx` ON `invitations` (`email`);--> statement-breakpoint
CREATE INDEX `memberships_user_idx` ON `memberships` (`user_id`);--> statement-breakpoint
CREATE INDEX `build_changes_build_idx` ON `build_changes` (`build_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `builds_crew_idx` ON `builds` (`crew_id`,`retired_at`);--> statement-breakpoint
CREATE INDEX `route_plans_crew_idx` ON `route_plans` (`crew_id`);--> statement-breakpoint
CREATE INDEX `uploads_crew_sha_idx` ON `uploads` (`crew_id`,`sha256`);--> statement-breakpoint
CREATE INDEX `events_run_start_idx` ON `events` (`run_id`,`start_s`);--> statement-breakpoint
CREATE INDEX `run_notes_run_idx` ON `run_notes` (`run_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `runs_crew_created_idx` ON `runs` (`crew_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `runs_crew_build_idx` ON `runs` (`crew_id`,`build_id`);--> statement-breakpoint
CREATE INDEX `runs_crew_verdict_idx` ON `runs` (`crew_id`,`verdict`);--> statement-breakpoint
CREATE INDEX `runs_upload_idx` ON `runs` (`upload_id`);--> statement-breakpoint
CREATE INDEX `column_maps_crew_idx` ON `column_maps` (`crew_id`);--> statement-breakpoint
CREATE INDEX `share_links_run_idx` ON `share_links` (`run_id`);--> statement-breakpoint
CREATE INDEX `audit_log_crew_created_idx` ON `audit_log` (`crew_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `audit_log_actor_idx` ON `audit_log` (`actor_id`);