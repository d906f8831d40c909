CREATE TABLE `studio_visits` (
	`user_id` text NOT NULL,
	`studio_id` text NOT NULL,
	`last_visit_at` integer NOT NULL,
	`since_at` integer,
	PRIMARY KEY(`user_id`, `studio_id`),
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`studio_id`) REFERENCES `studios`(`id`) ON UPDATE no action ON DELETE cascade
);
