CREATE TABLE `upload_line` (
	`job_id` text NOT NULL,
	`line` integer NOT NULL,
	`verdict` text NOT NULL,
	`submission_id` integer,
	`duplicate_of` text,
	`error_json` text,
	`order` integer,
	`width` integer,
	`height` integer,
	PRIMARY KEY(`job_id`, `line`),
	FOREIGN KEY (`job_id`) REFERENCES `job`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`submission_id`) REFERENCES `submission`(`id`) ON UPDATE no action ON DELETE set null
);
