CREATE TABLE `stock` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`canonical_key` text NOT NULL,
	`canonical_code` text NOT NULL,
	`squares_json` text NOT NULL,
	`width` integer NOT NULL,
	`height` integer NOT NULL,
	`order` integer NOT NULL,
	`square` integer NOT NULL,
	`perfect` integer NOT NULL,
	`simple` integer NOT NULL,
	`provenance` text NOT NULL,
	`setter_id` text,
	`params_json` text,
	`use_count` integer DEFAULT 0 NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	`accepted_at` integer,
	FOREIGN KEY (`setter_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `stock_canonical_key_unique` ON `stock` (`canonical_key`);--> statement-breakpoint
CREATE INDEX `stock_order_idx` ON `stock` (`order`,`id`);--> statement-breakpoint
CREATE INDEX `stock_width_idx` ON `stock` (`width`);--> statement-breakpoint
CREATE INDEX `stock_height_idx` ON `stock` (`height`);--> statement-breakpoint
CREATE INDEX `stock_created_idx` ON `stock` (`created_at`,`id`);--> statement-breakpoint
CREATE INDEX `stock_provenance_idx` ON `stock` (`provenance`);--> statement-breakpoint
CREATE INDEX `stock_setter_idx` ON `stock` (`setter_id`);--> statement-breakpoint
CREATE TABLE `submission` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`setter_id` text NOT NULL,
	`title` text,
	`note` text,
	`source` text NOT NULL,
	`code` text NOT NULL,
	`canonical_code` text NOT NULL,
	`canonical_key` text NOT NULL,
	`squares_json` text NOT NULL,
	`width` integer NOT NULL,
	`height` integer NOT NULL,
	`order` integer NOT NULL,
	`square` integer NOT NULL,
	`perfect` integer NOT NULL,
	`simple` integer NOT NULL,
	`status` text DEFAULT 'pending' NOT NULL,
	`duplicate_of` text,
	`editor_note` text,
	`reviewed_by` text,
	`reviewed_at` integer,
	`stock_id` integer,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`setter_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`reviewed_by`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`stock_id`) REFERENCES `stock`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `submission_setter_idx` ON `submission` (`setter_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `submission_status_idx` ON `submission` (`status`,`created_at`);--> statement-breakpoint
CREATE INDEX `submission_key_idx` ON `submission` (`canonical_key`);