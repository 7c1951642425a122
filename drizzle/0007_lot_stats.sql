CREATE TABLE `lot_stats` (
	`lot_id` integer PRIMARY KEY NOT NULL,
	`engine_version` text NOT NULL,
	`nominal` real NOT NULL,
	`tolerance_pct` real NOT NULL,
	`second_limit` real,
	`count` integer NOT NULL,
	`detail` text NOT NULL,
	`columns` text NOT NULL,
	`computed_at` integer NOT NULL,
	FOREIGN KEY (`lot_id`) REFERENCES `lots`(`id`) ON UPDATE no action ON DELETE cascade
);
