DROP INDEX `stock_width_idx`;--> statement-breakpoint
DROP INDEX `stock_height_idx`;--> statement-breakpoint
DROP INDEX `stock_created_idx`;--> statement-breakpoint
DROP INDEX `stock_provenance_idx`;--> statement-breakpoint
CREATE INDEX `stock_recent_idx` ON `stock` (`created_at`,`id`,`order`,`width`,`height`,`square`,`perfect`,`simple`,`provenance`,`use_count`,`setter_id`);--> statement-breakpoint
CREATE INDEX `stock_filter_idx` ON `stock` (`order`,`width`,`height`,`square`,`perfect`,`simple`,`provenance`,`use_count`,`setter_id`,`created_at`,`id`);