ALTER TABLE `stock` ADD `reduced_key` text;--> statement-breakpoint
CREATE INDEX `stock_reduced_key_idx` ON `stock` (`reduced_key`);--> statement-breakpoint
ALTER TABLE `submission` ADD `reduced_key` text;--> statement-breakpoint
CREATE INDEX `submission_reduced_key_idx` ON `submission` (`reduced_key`,`status`);