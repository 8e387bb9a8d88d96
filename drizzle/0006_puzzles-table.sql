CREATE TABLE `puzzle` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`stock_id` integer NOT NULL,
	`kind` text NOT NULL,
	`title` text NOT NULL,
	`status` text DEFAULT 'proving' NOT NULL,
	`grade` integer,
	`level` text,
	`show_frame` integer DEFAULT false NOT NULL,
	`starters_json` text DEFAULT '[]' NOT NULL,
	`givens_json` text DEFAULT '[]' NOT NULL,
	`steps_json` text DEFAULT '[]' NOT NULL,
	`certificate_json` text,
	`cert_input_hash` text,
	`cert_engine_version` text,
	`input_hash` text NOT NULL,
	`second_json` text,
	`notes_json` text DEFAULT '[]' NOT NULL,
	`recheck_json` text,
	`revision` integer DEFAULT 1 NOT NULL,
	`job_id` text,
	`created_by` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	`updated_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`stock_id`) REFERENCES `stock`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`created_by`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `puzzle_stock_idx` ON `puzzle` (`stock_id`);--> statement-breakpoint
CREATE INDEX `puzzle_status_idx` ON `puzzle` (`status`);--> statement-breakpoint
CREATE INDEX `puzzle_created_idx` ON `puzzle` (`created_at`,`id`);--> statement-breakpoint
CREATE INDEX `puzzle_kind_idx` ON `puzzle` (`kind`);