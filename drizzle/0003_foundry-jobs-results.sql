CREATE TABLE `foundry_result` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`job_id` text NOT NULL,
	`canonical_key` text NOT NULL,
	`code` text NOT NULL,
	`order` integer NOT NULL,
	`width` integer NOT NULL,
	`height` integer NOT NULL,
	`perfect` integer NOT NULL,
	`simple` integer NOT NULL,
	`square` integer NOT NULL,
	`max_size` integer NOT NULL,
	`origin` text,
	`stock_id` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`job_id`) REFERENCES `job`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `foundry_result_job_key_idx` ON `foundry_result` (`job_id`,`canonical_key`);--> statement-breakpoint
CREATE INDEX `foundry_result_key_idx` ON `foundry_result` (`canonical_key`);--> statement-breakpoint
CREATE TABLE `job` (
	`id` text PRIMARY KEY NOT NULL,
	`kind` text NOT NULL,
	`state` text DEFAULT 'queued' NOT NULL,
	`params` text NOT NULL,
	`progress` text,
	`summary` text,
	`error` text,
	`budget_ms` integer,
	`cancel_requested` integer DEFAULT false NOT NULL,
	`created_by` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	`started_at` integer,
	`finished_at` integer,
	FOREIGN KEY (`created_by`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `job_kind_created_idx` ON `job` (`kind`,`created_at`);--> statement-breakpoint
CREATE INDEX `job_state_idx` ON `job` (`state`);