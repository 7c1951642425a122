CREATE TABLE `outbox_attachments` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`message_id` integer NOT NULL,
	`filename` text NOT NULL,
	`content_type` text NOT NULL,
	`size` integer NOT NULL,
	`content` blob NOT NULL,
	FOREIGN KEY (`message_id`) REFERENCES `outbox`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `outbox_attachments_message_idx` ON `outbox_attachments` (`message_id`);--> statement-breakpoint
ALTER TABLE `job_parts` ADD `slot` text;--> statement-breakpoint
CREATE UNIQUE INDEX `job_parts_slot_idx` ON `job_parts` (`job_id`,`slot`);