ALTER TABLE `instruments` ADD `display_counts` integer;--> statement-breakpoint
ALTER TABLE `sweep_points` ADD `total` real;