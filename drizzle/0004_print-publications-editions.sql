CREATE TABLE `edition` (
	`id` text PRIMARY KEY NOT NULL,
	`publication_id` text NOT NULL,
	`number` integer NOT NULL,
	`edition_date` text NOT NULL,
	`state` text DEFAULT 'draft' NOT NULL,
	`introduction_json` text NOT NULL,
	`return_notes` text,
	`press_version` integer,
	`press_sha256` text,
	`press_path` text,
	`press_bytes` integer,
	`press_pages` integer,
	`press_created_at` integer,
	`published_at` integer,
	`published_by` text,
	`created_by` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	`updated_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`publication_id`) REFERENCES `publication`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`published_by`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`created_by`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `edition_publication_number_idx` ON `edition` (`publication_id`,`number`);--> statement-breakpoint
CREATE INDEX `edition_date_idx` ON `edition` (`edition_date`);--> statement-breakpoint
CREATE INDEX `edition_state_idx` ON `edition` (`state`);--> statement-breakpoint
CREATE TABLE `edition_proof` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`edition_id` text NOT NULL,
	`version` integer NOT NULL,
	`sha256` text NOT NULL,
	`path` text NOT NULL,
	`bytes` integer NOT NULL,
	`pages` integer NOT NULL,
	`preflight_json` text NOT NULL,
	`status` text DEFAULT 'pending' NOT NULL,
	`notes` text,
	`created_by` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	`decided_by` text,
	`decided_at` integer,
	FOREIGN KEY (`edition_id`) REFERENCES `edition`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`decided_by`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `edition_proof_version_idx` ON `edition_proof` (`edition_id`,`version`);--> statement-breakpoint
CREATE TABLE `edition_slot` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`edition_id` text NOT NULL,
	`position` integer NOT NULL,
	`puzzle_id` text NOT NULL,
	`instructions_json` text NOT NULL,
	FOREIGN KEY (`edition_id`) REFERENCES `edition`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `edition_slot_position_idx` ON `edition_slot` (`edition_id`,`position`);--> statement-breakpoint
CREATE UNIQUE INDEX `edition_slot_puzzle_idx` ON `edition_slot` (`edition_id`,`puzzle_id`);--> statement-breakpoint
CREATE INDEX `edition_slot_puzzle_lookup_idx` ON `edition_slot` (`puzzle_id`);--> statement-breakpoint
CREATE TABLE `publication` (
	`id` text PRIMARY KEY NOT NULL,
	`title` text NOT NULL,
	`publisher` text NOT NULL,
	`template_id` text NOT NULL,
	`cadence` text NOT NULL,
	`solution_rule` text NOT NULL,
	`reuse_window_days` integer NOT NULL,
	`currency` text NOT NULL,
	`fee_assembly_minor` integer NOT NULL,
	`fee_deduction_minor` integer NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	`updated_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	CONSTRAINT "publication_fees_check" CHECK("publication"."fee_assembly_minor" >= 0 and "publication"."fee_deduction_minor" >= 0),
	CONSTRAINT "publication_window_check" CHECK("publication"."reuse_window_days" >= 0),
	CONSTRAINT "publication_currency_check" CHECK(length("publication"."currency") = 3)
);
--> statement-breakpoint
CREATE UNIQUE INDEX `publication_title_unique` ON `publication` (`title`);