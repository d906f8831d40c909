CREATE TABLE `account_mail_sends` (
	`id` text PRIMARY KEY NOT NULL,
	`kind` text NOT NULL,
	`key` text NOT NULL,
	`sent_at` integer NOT NULL
);
--> statement-breakpoint
CREATE INDEX `account_mail_sends_key_idx` ON `account_mail_sends` (`kind`,`key`,`sent_at`);--> statement-breakpoint
CREATE TABLE `pending_signups` (
	`id` text PRIMARY KEY NOT NULL,
	`email` text NOT NULL,
	`name` text NOT NULL,
	`password_hash` text NOT NULL,
	`studio_name` text NOT NULL,
	`token_hash` text NOT NULL,
	`expires_at` integer NOT NULL,
	`created_at` integer NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `pending_signups_token_hash_unique` ON `pending_signups` (`token_hash`);--> statement-breakpoint
CREATE INDEX `pending_signups_email_idx` ON `pending_signups` (`email`);