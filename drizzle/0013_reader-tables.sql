CREATE TABLE `reader_grade` (
	`puzzle_id` integer PRIMARY KEY NOT NULL,
	`grade` integer,
	`note` text NOT NULL,
	`adjusted_by` text,
	`adjusted_at` integer NOT NULL,
	FOREIGN KEY (`puzzle_id`) REFERENCES `puzzle`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`adjusted_by`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null,
	CONSTRAINT "reader_grade_range" CHECK("reader_grade"."grade" is null or ("reader_grade"."grade" between 1 and 5))
);
--> statement-breakpoint
CREATE TABLE `reader_publication` (
	`publication_id` text PRIMARY KEY NOT NULL,
	`slug` text NOT NULL,
	`time_zone` text DEFAULT 'UTC' NOT NULL,
	`release_time` text DEFAULT '00:00' NOT NULL,
	`embed_origins_json` text DEFAULT '[]' NOT NULL,
	`updated_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`publication_id`) REFERENCES `publication`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `reader_publication_slug_unique` ON `reader_publication` (`slug`);--> statement-breakpoint
CREATE TABLE `solve_event` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`puzzle_id` integer NOT NULL,
	`edition_id` text NOT NULL,
	`play_id` text NOT NULL,
	`kind` text NOT NULL,
	`elapsed_ms` integer NOT NULL,
	`count` integer,
	`demo` integer DEFAULT false NOT NULL,
	`at` integer NOT NULL,
	FOREIGN KEY (`puzzle_id`) REFERENCES `puzzle`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`edition_id`) REFERENCES `edition`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `solve_event_puzzle_idx` ON `solve_event` (`puzzle_id`,`kind`);--> statement-breakpoint
CREATE INDEX `solve_event_edition_idx` ON `solve_event` (`edition_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `solve_event_once_idx` ON `solve_event` (`puzzle_id`,`play_id`,`kind`) WHERE "solve_event"."kind" in ('started', 'finished');