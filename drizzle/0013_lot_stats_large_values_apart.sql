CREATE TABLE `lot_items_encoded` (
	`lot_id` integer PRIMARY KEY NOT NULL,
	`mark` text NOT NULL,
	`gzip` blob NOT NULL,
	`br` blob NOT NULL,
	FOREIGN KEY (`lot_id`) REFERENCES `lots`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `lot_stats_columns` (
	`lot_id` integer PRIMARY KEY NOT NULL,
	`columns` text NOT NULL,
	FOREIGN KEY (`lot_id`) REFERENCES `lots`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
-- The stored values move to their tables before their columns go (custom: drizzle-kit drops them).
INSERT INTO `lot_stats_columns` (`lot_id`, `columns`) SELECT `lot_id`, `columns` FROM `lot_stats`;--> statement-breakpoint
INSERT INTO `lot_items_encoded` (`lot_id`, `mark`, `gzip`, `br`)
  SELECT `lot_id`, `items_mark`, `items_gzip`, `items_br` FROM `lot_stats`
  WHERE `items_mark` IS NOT NULL AND `items_gzip` IS NOT NULL AND `items_br` IS NOT NULL;--> statement-breakpoint
ALTER TABLE `lot_stats` DROP COLUMN `columns`;--> statement-breakpoint
ALTER TABLE `lot_stats` DROP COLUMN `items_mark`;--> statement-breakpoint
ALTER TABLE `lot_stats` DROP COLUMN `items_gzip`;--> statement-breakpoint
ALTER TABLE `lot_stats` DROP COLUMN `items_br`;