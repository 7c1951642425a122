ALTER TABLE `lots` ADD `instrument_id` integer REFERENCES instruments(id);--> statement-breakpoint
ALTER TABLE `lots` ADD `test_frequency` real;