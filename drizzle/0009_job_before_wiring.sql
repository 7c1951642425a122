ALTER TABLE `jobs` ADD `before_harness_id` integer;--> statement-breakpoint
ALTER TABLE `jobs` ADD `before_design` text;--> statement-breakpoint
ALTER TABLE `jobs` ADD `recording_chain` text;