CREATE TABLE `plan_revisions` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`workspace_id` bigint unsigned NOT NULL,
	`plan_id` bigint unsigned NOT NULL,
	`sequence` int NOT NULL,
	`label` varchar(3) NOT NULL,
	`change_summary` varchar(4000) NOT NULL,
	`plan_version` int NOT NULL,
	`plan` json NOT NULL,
	`report` json NOT NULL,
	`content_hash` char(64) NOT NULL,
	`worst_verdict` enum('meets','marginal','fails'),
	`created_by_user_id` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`state` enum('draft','in-review','released','changes-requested','superseded') NOT NULL DEFAULT 'draft',
	`state_changed_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `plan_revisions_id` PRIMARY KEY(`id`),
	CONSTRAINT `plan_revisions_plan_sequence_unique` UNIQUE(`plan_id`,`sequence`),
	CONSTRAINT `plan_revisions_plan_label_unique` UNIQUE(`plan_id`,`label`)
);
--> statement-breakpoint
CREATE TABLE `review_comments` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`workspace_id` bigint unsigned NOT NULL,
	`revision_id` bigint unsigned NOT NULL,
	`parent_comment_id` bigint unsigned,
	`author_user_id` bigint unsigned NOT NULL,
	`anchor_kind` enum('stage','check') NOT NULL,
	`anchor_id` varchar(100) NOT NULL,
	`body` text NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`resolved_at` datetime(3),
	`resolved_by_user_id` bigint unsigned,
	CONSTRAINT `review_comments_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `review_request_reviewers` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`review_request_id` bigint unsigned NOT NULL,
	`reviewer_user_id` bigint unsigned NOT NULL,
	CONSTRAINT `review_request_reviewers_id` PRIMARY KEY(`id`),
	CONSTRAINT `review_request_reviewers_unique` UNIQUE(`review_request_id`,`reviewer_user_id`)
);
--> statement-breakpoint
CREATE TABLE `review_requests` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`workspace_id` bigint unsigned NOT NULL,
	`revision_id` bigint unsigned NOT NULL,
	`requested_by_user_id` bigint unsigned NOT NULL,
	`message` varchar(2000) NOT NULL DEFAULT '',
	`status` enum('open','approved','changes-requested','closed') NOT NULL DEFAULT 'open',
	`requested_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`closed_at` datetime(3),
	CONSTRAINT `review_requests_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `review_signatures` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`workspace_id` bigint unsigned NOT NULL,
	`revision_id` bigint unsigned NOT NULL,
	`review_request_id` bigint unsigned NOT NULL,
	`signer_user_id` bigint unsigned NOT NULL,
	`signer_role` enum('admin','engineer','reviewer','regulator') NOT NULL,
	`meaning` enum('approved','changes-requested') NOT NULL,
	`content_hash` char(64) NOT NULL,
	`note` varchar(2000) NOT NULL DEFAULT '',
	`signed_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `review_signatures_id` PRIMARY KEY(`id`),
	CONSTRAINT `review_signatures_request_signer_unique` UNIQUE(`review_request_id`,`signer_user_id`)
);
--> statement-breakpoint
CREATE TABLE `revision_state_events` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`workspace_id` bigint unsigned NOT NULL,
	`revision_id` bigint unsigned NOT NULL,
	`from_state` enum('draft','in-review','released','changes-requested','superseded'),
	`to_state` enum('draft','in-review','released','changes-requested','superseded') NOT NULL,
	`actor_user_id` bigint unsigned,
	`at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`reason` varchar(500) NOT NULL DEFAULT '',
	CONSTRAINT `revision_state_events_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `plan_revisions` ADD CONSTRAINT `plan_revisions_workspace_id_workspaces_id_fk` FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `plan_revisions` ADD CONSTRAINT `plan_revisions_plan_id_channel_plans_id_fk` FOREIGN KEY (`plan_id`) REFERENCES `channel_plans`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `plan_revisions` ADD CONSTRAINT `plan_revisions_created_by_user_id_users_id_fk` FOREIGN KEY (`created_by_user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `review_comments` ADD CONSTRAINT `review_comments_workspace_id_workspaces_id_fk` FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `review_comments` ADD CONSTRAINT `review_comments_revision_id_plan_revisions_id_fk` FOREIGN KEY (`revision_id`) REFERENCES `plan_revisions`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `review_comments` ADD CONSTRAINT `review_comments_author_user_id_users_id_fk` FOREIGN KEY (`author_user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `review_comments` ADD CONSTRAINT `review_comments_resolved_by_user_id_users_id_fk` FOREIGN KEY (`resolved_by_user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `review_request_reviewers` ADD CONSTRAINT `review_request_reviewers_review_request_id_review_requests_id_fk` FOREIGN KEY (`review_request_id`) REFERENCES `review_requests`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `review_request_reviewers` ADD CONSTRAINT `review_request_reviewers_reviewer_user_id_users_id_fk` FOREIGN KEY (`reviewer_user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `review_requests` ADD CONSTRAINT `review_requests_workspace_id_workspaces_id_fk` FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `review_requests` ADD CONSTRAINT `review_requests_revision_id_plan_revisions_id_fk` FOREIGN KEY (`revision_id`) REFERENCES `plan_revisions`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `review_requests` ADD CONSTRAINT `review_requests_requested_by_user_id_users_id_fk` FOREIGN KEY (`requested_by_user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `review_signatures` ADD CONSTRAINT `review_signatures_workspace_id_workspaces_id_fk` FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `review_signatures` ADD CONSTRAINT `review_signatures_revision_id_plan_revisions_id_fk` FOREIGN KEY (`revision_id`) REFERENCES `plan_revisions`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `review_signatures` ADD CONSTRAINT `review_signatures_review_request_id_review_requests_id_fk` FOREIGN KEY (`review_request_id`) REFERENCES `review_requests`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `review_signatures` ADD CONSTRAINT `review_signatures_signer_user_id_users_id_fk` FOREIGN KEY (`signer_user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `revision_state_events` ADD CONSTRAINT `revision_state_events_workspace_id_workspaces_id_fk` FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `revision_state_events` ADD CONSTRAINT `revision_state_events_revision_id_plan_revisions_id_fk` FOREIGN KEY (`revision_id`) REFERENCES `plan_revisions`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `revision_state_events` ADD CONSTRAINT `revision_state_events_actor_user_id_users_id_fk` FOREIGN KEY (`actor_user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `plan_revisions_workspace_state_idx` ON `plan_revisions` (`workspace_id`,`state`);--> statement-breakpoint
CREATE INDEX `review_comments_revision_idx` ON `review_comments` (`revision_id`);--> statement-breakpoint
CREATE INDEX `review_requests_revision_idx` ON `review_requests` (`revision_id`);--> statement-breakpoint
CREATE INDEX `revision_state_events_revision_idx` ON `revision_state_events` (`revision_id`);