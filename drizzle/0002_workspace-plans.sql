CREATE TABLE `channel_plans` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`program_id` bigint unsigned NOT NULL,
	`workspace_id` bigint unsigned NOT NULL,
	`name` varchar(200) NOT NULL,
	`profile_id` varchar(100) NOT NULL,
	`application` varchar(10) NOT NULL,
	`plan` json NOT NULL,
	`report` json,
	`worst_verdict` enum('meets','marginal','fails'),
	`version` int NOT NULL DEFAULT 1,
	`archived_at` datetime(3),
	`created_by_user_id` bigint unsigned NOT NULL,
	`updated_by_user_id` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `channel_plans_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `parts` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`workspace_id` bigint unsigned NOT NULL,
	`kind` enum('instrumentation-amplifier','operational-amplifier','converter','electrode') NOT NULL,
	`name` varchar(120) NOT NULL,
	`description` varchar(500) NOT NULL DEFAULT '',
	`status` enum('approved','under-evaluation','not-for-new-designs') NOT NULL,
	`source_note` varchar(500) NOT NULL,
	`values` json NOT NULL,
	`retired_at` datetime(3),
	`created_by_user_id` bigint unsigned NOT NULL,
	`updated_by_user_id` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `parts_id` PRIMARY KEY(`id`),
	CONSTRAINT `parts_workspace_kind_name_unique` UNIQUE(`workspace_id`,`kind`,`name`)
);
--> statement-breakpoint
CREATE TABLE `programs` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`workspace_id` bigint unsigned NOT NULL,
	`name` varchar(200) NOT NULL,
	`description` varchar(2000) NOT NULL DEFAULT '',
	`archived_at` datetime(3),
	`created_by_user_id` bigint unsigned NOT NULL,
	`updated_by_user_id` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `programs_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `channel_plans` ADD CONSTRAINT `channel_plans_program_id_programs_id_fk` FOREIGN KEY (`program_id`) REFERENCES `programs`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `channel_plans` ADD CONSTRAINT `channel_plans_workspace_id_workspaces_id_fk` FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `channel_plans` ADD CONSTRAINT `channel_plans_created_by_user_id_users_id_fk` FOREIGN KEY (`created_by_user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `channel_plans` ADD CONSTRAINT `channel_plans_updated_by_user_id_users_id_fk` FOREIGN KEY (`updated_by_user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `parts` ADD CONSTRAINT `parts_workspace_id_workspaces_id_fk` FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `parts` ADD CONSTRAINT `parts_created_by_user_id_users_id_fk` FOREIGN KEY (`created_by_user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `parts` ADD CONSTRAINT `parts_updated_by_user_id_users_id_fk` FOREIGN KEY (`updated_by_user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `programs` ADD CONSTRAINT `programs_workspace_id_workspaces_id_fk` FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `programs` ADD CONSTRAINT `programs_created_by_user_id_users_id_fk` FOREIGN KEY (`created_by_user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `programs` ADD CONSTRAINT `programs_updated_by_user_id_users_id_fk` FOREIGN KEY (`updated_by_user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `channel_plans_program_idx` ON `channel_plans` (`program_id`);--> statement-breakpoint
CREATE INDEX `channel_plans_workspace_idx` ON `channel_plans` (`workspace_id`);--> statement-breakpoint
CREATE INDEX `programs_workspace_idx` ON `programs` (`workspace_id`,`archived_at`);