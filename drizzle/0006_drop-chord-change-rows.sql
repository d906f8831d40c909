DROP TABLE `change_results`;--> statement-breakpoint
DROP TABLE `chord_events`;