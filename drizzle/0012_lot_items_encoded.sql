ALTER TABLE `lot_stats` ADD `items_mark` text;--> statement-breakpoint
ALTER TABLE `lot_stats` ADD `items_gzip` blob;--> statement-breakpoint
ALTER TABLE `lot_stats` ADD `items_br` blob;