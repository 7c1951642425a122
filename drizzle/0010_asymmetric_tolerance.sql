ALTER TABLE `lot_stats` ADD `tolerance_plus_pct` real;--> statement-breakpoint
ALTER TABLE `lots` ADD `tolerance_plus_pct` real;--> statement-breakpoint
ALTER TABLE `parts` ADD `tolerance_plus_pct` real;