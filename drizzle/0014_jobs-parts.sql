CREATE TABLE `job_part` (
	`job_id` text NOT NULL,
	`idx` integer NOT NULL,
	`state` text DEFAULT 'queued' NOT NULL,
	`summary` text,
	`error` text,
	`attempts` integer DEFAULT 0 NOT NULL,
	`started_at` integer,
	`finished_at` integer,
	PRIMARY KEY(`job_id`, `idx`),
	FOREIGN KEY (`job_id`) REFERENCES `job`(`id`) ON UPDATE no action ON DELETE cascade
);
