ALTER TABLE `harnesses` ADD `layout` text DEFAULT 'one-pickup' NOT NULL;--> statement-breakpoint
ALTER TABLE `harnesses` ADD `selector` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `harnesses` ADD `options` text DEFAULT '{}' NOT NULL;--> statement-breakpoint
ALTER TABLE `harnesses` ADD `knobs` text;