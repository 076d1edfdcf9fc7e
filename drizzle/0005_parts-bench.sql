CREATE TABLE `bench_record_chunks` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`record_id` bigint unsigned NOT NULL,
	`sequence` int NOT NULL,
	`bytes` mediumblob NOT NULL,
	CONSTRAINT `bench_record_chunks_id` PRIMARY KEY(`id`),
	CONSTRAINT `bench_record_chunks_record_sequence_unique` UNIQUE(`record_id`,`sequence`)
);
--> statement-breakpoint
CREATE TABLE `bench_records` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`workspace_id` bigint unsigned NOT NULL,
	`plan_id` bigint unsigned NOT NULL,
	`revision_id` bigint unsigned NOT NULL,
	`file_name` varchar(255) NOT NULL,
	`format` enum('edf','csv') NOT NULL,
	`byte_length` int NOT NULL,
	`sha256` char(64) NOT NULL,
	`chunk_count` int NOT NULL,
	`channel` varchar(120) NOT NULL,
	`unit` enum('V','mV','uV'),
	`sample_rate_given_hz` double,
	`gain_mode` enum('referred-to-input','gain-to-apply') NOT NULL,
	`gain_v_per_v` double NOT NULL,
	`note` varchar(500) NOT NULL DEFAULT '',
	`analysis` json NOT NULL,
	`comparison` json NOT NULL,
	`withdrawn_at` datetime(3),
	`withdrawn_by_user_id` bigint unsigned,
	`withdrawn_reason` varchar(500),
	`created_by_user_id` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `bench_records_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `part_import_mappings` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`workspace_id` bigint unsigned NOT NULL,
	`kind` enum('instrumentation-amplifier','operational-amplifier','converter','electrode') NOT NULL,
	`mapping` json NOT NULL,
	`updated_by_user_id` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `part_import_mappings_id` PRIMARY KEY(`id`),
	CONSTRAINT `part_import_mappings_workspace_kind_unique` UNIQUE(`workspace_id`,`kind`)
);
--> statement-breakpoint
ALTER TABLE `bench_record_chunks` ADD CONSTRAINT `bench_record_chunks_record_id_bench_records_id_fk` FOREIGN KEY (`record_id`) REFERENCES `bench_records`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `bench_records` ADD CONSTRAINT `bench_records_workspace_id_workspaces_id_fk` FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `bench_records` ADD CONSTRAINT `bench_records_plan_id_channel_plans_id_fk` FOREIGN KEY (`plan_id`) REFERENCES `channel_plans`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `bench_records` ADD CONSTRAINT `bench_records_revision_id_plan_revisions_id_fk` FOREIGN KEY (`revision_id`) REFERENCES `plan_revisions`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `bench_records` ADD CONSTRAINT `bench_records_withdrawn_by_user_id_users_id_fk` FOREIGN KEY (`withdrawn_by_user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `bench_records` ADD CONSTRAINT `bench_records_created_by_user_id_users_id_fk` FOREIGN KEY (`created_by_user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `part_import_mappings` ADD CONSTRAINT `part_import_mappings_workspace_id_workspaces_id_fk` FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `part_import_mappings` ADD CONSTRAINT `part_import_mappings_updated_by_user_id_users_id_fk` FOREIGN KEY (`updated_by_user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `bench_records_revision_idx` ON `bench_records` (`revision_id`);--> statement-breakpoint
CREATE INDEX `bench_records_workspace_plan_idx` ON `bench_records` (`workspace_id`,`plan_id`);