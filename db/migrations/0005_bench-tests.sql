CREATE TABLE `bench_tests` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`build_id` bigint unsigned NOT NULL,
	`run_id` bigint unsigned,
	`recorded_by` bigint unsigned,
	`tested_at` datetime(3) NOT NULL,
	`recorded_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`result` enum('pass','late','wrong-action','not-triggered','not-assessed') NOT NULL,
	`commanded_latency_s` float,
	`flown_latency_s` float,
	`flown_state` enum('seen','none','not-logged'),
	`action` enum('return-to-home','hold','land'),
	`failsafe` json,
	`note` varchar(500),
	CONSTRAINT `bench_tests_id` PRIMARY KEY(`id`),
	CONSTRAINT `bench_tests_build_run_uq` UNIQUE(`build_id`,`run_id`)
);
--> statement-breakpoint
ALTER TABLE `builds` ADD `link_sheet_changed_at` datetime(3);--> statement-breakpoint
ALTER TABLE `bench_tests` ADD CONSTRAINT `bench_tests_build_id_builds_id_fk` FOREIGN KEY (`build_id`) REFERENCES `builds`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `bench_tests` ADD CONSTRAINT `bench_tests_run_id_runs_id_fk` FOREIGN KEY (`run_id`) REFERENCES `runs`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `bench_tests` ADD CONSTRAINT `bench_tests_recorded_by_users_id_fk` FOREIGN KEY (`recorded_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `bench_tests_build_tested_idx` ON `bench_tests` (`build_id`,`tested_at`);--> statement-breakpoint
CREATE INDEX `bench_tests_run_idx` ON `bench_tests` (`run_id`);