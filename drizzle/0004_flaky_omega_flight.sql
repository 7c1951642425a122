PRAGMA foreign_keys=OFF;--> statement-breakpoint
CREATE TABLE `__new_harnesses` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`name` text NOT NULL,
	`layout` text DEFAULT 'one-pickup' NOT NULL,
	`selector` integer DEFAULT 0 NOT NULL,
	`options` text DEFAULT '{}' NOT NULL,
	`knobs` text,
	`preset` text,
	`values` text NOT NULL,
	`part_refs` text,
	`notes` text,
	`owner_id` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	`updated_at` integer,
	FOREIGN KEY (`owner_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
INSERT INTO `__new_harnesses`("id", "name", "layout", "selector", "options", "knobs", "preset", "values", "part_refs", "notes", "owner_id", "created_at", "updated_at") SELECT "id", "name", "layout", "selector", "options", "knobs", "preset", "values", "part_refs", "notes", "owner_id", "created_at", "updated_at" FROM `harnesses`;--> statement-breakpoint
DROP TABLE `harnesses`;--> statement-breakpoint
ALTER TABLE `__new_harnesses` RENAME TO `harnesses`;--> statement-breakpoint
PRAGMA foreign_keys=ON;