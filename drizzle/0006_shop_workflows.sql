ALTER TABLE `comparisons` ADD `notes` text;--> statement-breakpoint
ALTER TABLE `job_parts` ADD `override_reason` text;--> statement-breakpoint
ALTER TABLE `lots` ADD `instrument_id` integer REFERENCES instruments(id);--> statement-breakpoint
ALTER TABLE `lots` ADD `test_frequency` real;--> statement-breakpoint
CREATE INDEX `parts_label_lower_idx` ON `parts` (lower("label"));