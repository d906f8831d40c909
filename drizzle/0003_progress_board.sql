CREATE TABLE `practice_reminders` (
	`id` text PRIMARY KEY NOT NULL,
	`studio_id` text NOT NULL,
	`student_id` text NOT NULL,
	`week_key` text NOT NULL,
	`sent_by_id` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`studio_id`) REFERENCES `studios`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`student_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`sent_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `practice_reminders_week_unique` ON `practice_reminders` (`studio_id`,`student_id`,`week_key`);--> statement-breakpoint
CREATE TABLE `progress_reports` (
	`id` text PRIMARY KEY NOT NULL,
	`studio_id` text NOT NULL,
	`student_id` text NOT NULL,
	`from_date` text NOT NULL,
	`to_date` text NOT NULL,
	`summary` text NOT NULL,
	`created_by_id` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`studio_id`) REFERENCES `studios`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`student_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `progress_reports_student_idx` ON `progress_reports` (`studio_id`,`student_id`,`created_at`);