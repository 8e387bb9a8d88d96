CREATE TABLE `output_profile` (
	`sha256` text PRIMARY KEY NOT NULL,
	`description` text NOT NULL,
	`icc` blob NOT NULL,
	`uploaded_by` text,
	`uploaded_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`uploaded_by`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE TABLE `publication_printer` (
	`publication_id` text NOT NULL,
	`user_id` text NOT NULL,
	PRIMARY KEY(`publication_id`, `user_id`),
	FOREIGN KEY (`publication_id`) REFERENCES `publication`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `publication_printer_user_idx` ON `publication_printer` (`user_id`);--> statement-breakpoint
ALTER TABLE `publication` ADD `press_standard` text;--> statement-breakpoint
ALTER TABLE `publication` ADD `press_condition` text;--> statement-breakpoint
ALTER TABLE `publication` ADD `press_bleed_mm` real;--> statement-breakpoint
ALTER TABLE `publication` ADD `press_min_type_pt` real;--> statement-breakpoint
ALTER TABLE `publication` ADD `press_min_line_pt` real;--> statement-breakpoint
ALTER TABLE `publication` ADD `output_profile_sha256` text REFERENCES output_profile(sha256);--> statement-breakpoint
-- Keep what printers saw before assignments existed: every printer is assigned to every existing publication.
INSERT INTO `publication_printer` (`publication_id`, `user_id`) SELECT `publication`.`id`, `user`.`id` FROM `publication`, `user` WHERE `user`.`role` = 'printer';