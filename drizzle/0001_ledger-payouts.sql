CREATE TABLE `ledger_entry` (
	`id` text PRIMARY KEY NOT NULL,
	`kind` text NOT NULL,
	`setter_id` text NOT NULL,
	`edition_id` text,
	`publication_id` text,
	`puzzle_id` text,
	`puzzle_kind` text,
	`amount_minor` integer NOT NULL,
	`currency` text NOT NULL,
	`entry_date` text NOT NULL,
	`reason` text,
	`corrects_entry_id` text,
	`created_by` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`setter_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`created_by`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null,
	CONSTRAINT "ledger_entry_currency_check" CHECK(length("ledger_entry"."currency") = 3)
);
--> statement-breakpoint
CREATE INDEX `ledger_entry_setter_date_idx` ON `ledger_entry` (`setter_id`,`entry_date`);--> statement-breakpoint
CREATE UNIQUE INDEX `ledger_entry_fee_once_idx` ON `ledger_entry` (`edition_id`,`puzzle_id`) WHERE kind = 'fee';--> statement-breakpoint
CREATE TABLE `payment_event` (
	`id` text PRIMARY KEY NOT NULL,
	`type` text NOT NULL,
	`payout_id` text,
	`received_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL
);
--> statement-breakpoint
CREATE TABLE `payout` (
	`id` text PRIMARY KEY NOT NULL,
	`run_id` text NOT NULL,
	`setter_id` text NOT NULL,
	`provider_account_id` text NOT NULL,
	`amount_minor` integer NOT NULL,
	`currency` text NOT NULL,
	`state` text DEFAULT 'pending' NOT NULL,
	`attempt` integer DEFAULT 1 NOT NULL,
	`provider_transfer_id` text,
	`provider_payout_id` text,
	`failure_message` text,
	`last_error` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	`updated_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	`paid_at` integer,
	FOREIGN KEY (`run_id`) REFERENCES `payout_run`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`setter_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "payout_amount_positive" CHECK("payout"."amount_minor" > 0)
);
--> statement-breakpoint
CREATE INDEX `payout_setter_idx` ON `payout` (`setter_id`);--> statement-breakpoint
CREATE INDEX `payout_run_idx` ON `payout` (`run_id`);--> statement-breakpoint
CREATE INDEX `payout_provider_payout_idx` ON `payout` (`provider_payout_id`);--> statement-breakpoint
CREATE TABLE `payout_account` (
	`setter_id` text PRIMARY KEY NOT NULL,
	`provider_account_id` text NOT NULL,
	`status` text NOT NULL,
	`display_hint` text NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	`updated_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`setter_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE restrict
);
--> statement-breakpoint
CREATE UNIQUE INDEX `payout_account_provider_account_id_unique` ON `payout_account` (`provider_account_id`);--> statement-breakpoint
CREATE TABLE `payout_run` (
	`id` text PRIMARY KEY NOT NULL,
	`request_key` text NOT NULL,
	`created_by` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`created_by`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `payout_run_request_key_unique` ON `payout_run` (`request_key`);--> statement-breakpoint
CREATE TABLE `statement_mailing` (
	`setter_id` text NOT NULL,
	`month` text NOT NULL,
	`sent_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`setter_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE restrict
);
--> statement-breakpoint
CREATE UNIQUE INDEX `statement_mailing_once_idx` ON `statement_mailing` (`setter_id`,`month`);