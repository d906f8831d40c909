CREATE TABLE `comment_reads` (
	`user_id` text NOT NULL,
	`take_id` text NOT NULL,
	`read_at` integer NOT NULL,
	PRIMARY KEY(`user_id`, `take_id`),
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`take_id`) REFERENCES `takes`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `comments` (
	`id` text PRIMARY KEY NOT NULL,
	`take_id` text NOT NULL,
	`author_id` text NOT NULL,
	`change_idx` integer,
	`parent_id` text,
	`body` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`take_id`) REFERENCES `takes`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`author_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`parent_id`) REFERENCES `comments`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `comments_take_idx` ON `comments` (`take_id`,`created_at`);--> statement-breakpoint
CREATE TABLE `intended_flags` (
	`id` text PRIMARY KEY NOT NULL,
	`take_id` text NOT NULL,
	`on` text NOT NULL,
	`idx` integer NOT NULL,
	`flag` text NOT NULL,
	`reason` text NOT NULL,
	`by_id` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`take_id`) REFERENCES `takes`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `intended_flags_unique` ON `intended_flags` (`take_id`,`on`,`idx`,`flag`);--> statement-breakpoint
CREATE TABLE `sent_mails` (
	`id` text PRIMARY KEY NOT NULL,
	`kind` text NOT NULL,
	`user_id` text NOT NULL,
	`key` text NOT NULL,
	`sent_at` integer NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `sent_mails_user_key_unique` ON `sent_mails` (`user_id`,`key`);--> statement-breakpoint
CREATE INDEX `sent_mails_kind_idx` ON `sent_mails` (`kind`,`sent_at`);--> statement-breakpoint
CREATE TABLE `take_reviews` (
	`take_id` text PRIMARY KEY NOT NULL,
	`reviewed_by_id` text,
	`reviewed_at` integer NOT NULL,
	FOREIGN KEY (`take_id`) REFERENCES `takes`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`reviewed_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
ALTER TABLE `exercises` ADD `model_start` text;--> statement-breakpoint
ALTER TABLE `exercises` ADD `model_file_key` text;--> statement-breakpoint
ALTER TABLE `exercises` ADD `model_original_name` text;