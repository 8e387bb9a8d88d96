-- foundry_result.stock_id: text without a foreign key -> integer referencing stock(id). Every row is kept;
-- a stock id that names no stock row (none are ever deleted, so there should be none) becomes NULL.
PRAGMA foreign_keys=OFF;--> statement-breakpoint
CREATE TABLE `__new_foundry_result` (
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
	`stock_id` integer,
	`created_at` integer DEFAULT (cast(unixepoch('subsecond') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`job_id`) REFERENCES `job`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`stock_id`) REFERENCES `stock`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
INSERT INTO `__new_foundry_result`("id", "job_id", "canonical_key", "code", "order", "width", "height", "perfect", "simple", "square", "max_size", "origin", "stock_id", "created_at") SELECT "id", "job_id", "canonical_key", "code", "order", "width", "height", "perfect", "simple", "square", "max_size", "origin", (SELECT `stock`.`id` FROM `stock` WHERE `stock`.`id` = CAST(`foundry_result`.`stock_id` AS integer)), "created_at" FROM `foundry_result`;--> statement-breakpoint
DROP TABLE `foundry_result`;--> statement-breakpoint
ALTER TABLE `__new_foundry_result` RENAME TO `foundry_result`;--> statement-breakpoint
PRAGMA foreign_keys=ON;--> statement-breakpoint
CREATE UNIQUE INDEX `foundry_result_job_key_idx` ON `foundry_result` (`job_id`,`canonical_key`);--> statement-breakpoint
CREATE INDEX `foundry_result_key_idx` ON `foundry_result` (`canonical_key`);