CREATE TABLE `change_results` (
	`take_id` text NOT NULL,
	`idx` integer NOT NULL,
	`from_idx` integer NOT NULL,
	`to_idx` integer NOT NULL,
	`motion` integer,
	`best_motion` integer,
	`best_voicing` text,
	`suggestions` text NOT NULL,
	`flags` text NOT NULL,
	`bass_motion` integer,
	`top_interval` integer,
	`common_tones` integer,
	`largest_move` integer,
	PRIMARY KEY(`take_id`, `idx`),
	FOREIGN KEY (`take_id`) REFERENCES `takes`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `chord_events` (
	`take_id` text NOT NULL,
	`idx` integer NOT NULL,
	`start_sec` real NOT NULL,
	`end_sec` real NOT NULL,
	`notes` text NOT NULL,
	`grace_notes` text NOT NULL,
	`root` text,
	`bass` text NOT NULL,
	`symbol` text,
	`roman` text,
	`quality` text,
	`inversion` integer,
	`upper_inversion` integer,
	`voicing` text NOT NULL,
	`top_note` integer NOT NULL,
	`flags` text NOT NULL,
	`techniques` text NOT NULL,
	PRIMARY KEY(`take_id`, `idx`),
	FOREIGN KEY (`take_id`) REFERENCES `takes`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `exercise_assignees` (
	`exercise_id` text NOT NULL,
	`user_id` text NOT NULL,
	PRIMARY KEY(`exercise_id`, `user_id`),
	FOREIGN KEY (`exercise_id`) REFERENCES `exercises`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `exercise_assignees_user_idx` ON `exercise_assignees` (`user_id`);--> statement-breakpoint
CREATE TABLE `exercises` (
	`id` text PRIMARY KEY NOT NULL,
	`studio_id` text NOT NULL,
	`created_by_id` text,
	`title` text NOT NULL,
	`keys` text NOT NULL,
	`progression` text NOT NULL,
	`focus_techniques` text DEFAULT '[]' NOT NULL,
	`tempo` integer,
	`due_date` text,
	`instructions` text DEFAULT '' NOT NULL,
	`assigned_to` text DEFAULT 'studio' NOT NULL,
	`archived_at` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`studio_id`) REFERENCES `studios`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `exercises_studio_idx` ON `exercises` (`studio_id`,`archived_at`,`due_date`);--> statement-breakpoint
CREATE TABLE `memberships` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`studio_id` text NOT NULL,
	`role` text NOT NULL,
	`status` text DEFAULT 'active' NOT NULL,
	`created_at` integer NOT NULL,
	`removed_at` integer,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`studio_id`) REFERENCES `studios`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `memberships_user_studio_unique` ON `memberships` (`user_id`,`studio_id`);--> statement-breakpoint
CREATE INDEX `memberships_studio_role_idx` ON `memberships` (`studio_id`,`role`,`status`);--> statement-breakpoint
CREATE TABLE `sessions` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`active_studio_id` text,
	`expires_at` integer NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`active_studio_id`) REFERENCES `studios`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `sessions_user_idx` ON `sessions` (`user_id`);--> statement-breakpoint
CREATE TABLE `studios` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`time_zone` text DEFAULT 'UTC' NOT NULL,
	`created_at` integer NOT NULL
);
--> statement-breakpoint
CREATE TABLE `take_metrics` (
	`take_id` text PRIMARY KEY NOT NULL,
	`chord_count` integer NOT NULL,
	`change_count` integer NOT NULL,
	`melody_note_count` integer DEFAULT 0 NOT NULL,
	`total_motion` integer NOT NULL,
	`best_total_motion` integer NOT NULL,
	`smoothness` real NOT NULL,
	`root_position_leaps` integer NOT NULL,
	`score` real NOT NULL,
	`accuracy` real,
	`estimated_key` text,
	`tempo_steadiness` real,
	`flags` text NOT NULL,
	`techniques` text NOT NULL,
	`top_line` text NOT NULL,
	`mismatches` text,
	FOREIGN KEY (`take_id`) REFERENCES `takes`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `takes` (
	`id` text PRIMARY KEY NOT NULL,
	`student_id` text NOT NULL,
	`studio_id` text NOT NULL,
	`exercise_id` text,
	`key` text,
	`note` text DEFAULT '' NOT NULL,
	`file_key` text NOT NULL,
	`original_name` text NOT NULL,
	`size` integer NOT NULL,
	`content_hash` text NOT NULL,
	`status` text DEFAULT 'pending' NOT NULL,
	`error` text,
	`recorded_at` integer NOT NULL,
	`week_key` text NOT NULL,
	`duration_sec` real DEFAULT 0 NOT NULL,
	`analysis_version` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`student_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`studio_id`) REFERENCES `studios`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`exercise_id`) REFERENCES `exercises`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `takes_student_hash_unique` ON `takes` (`student_id`,`content_hash`);--> statement-breakpoint
CREATE INDEX `takes_student_recorded_idx` ON `takes` (`student_id`,`recorded_at`);--> statement-breakpoint
CREATE INDEX `takes_studio_week_idx` ON `takes` (`studio_id`,`week_key`,`student_id`);--> statement-breakpoint
CREATE INDEX `takes_studio_created_idx` ON `takes` (`studio_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `takes_exercise_idx` ON `takes` (`exercise_id`);--> statement-breakpoint
CREATE INDEX `takes_version_idx` ON `takes` (`analysis_version`);--> statement-breakpoint
CREATE TABLE `users` (
	`id` text PRIMARY KEY NOT NULL,
	`email` text NOT NULL,
	`name` text NOT NULL,
	`password_hash` text NOT NULL,
	`email_verified_at` integer,
	`mail_on_feedback` integer DEFAULT true NOT NULL,
	`mail_digest` integer DEFAULT true NOT NULL,
	`created_at` integer NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `users_email_unique` ON `users` (`email`);