CREATE TABLE `stock_revision` (
	`id` integer PRIMARY KEY NOT NULL,
	`rewrites` integer NOT NULL
);
--> statement-breakpoint
INSERT INTO `stock_revision` (`id`, `rewrites`) VALUES (1, 0);--> statement-breakpoint
CREATE TRIGGER `stock_revision_update` AFTER UPDATE ON `stock` BEGIN UPDATE `stock_revision` SET `rewrites` = `rewrites` + 1 WHERE `id` = 1; END;--> statement-breakpoint
CREATE TRIGGER `stock_revision_delete` AFTER DELETE ON `stock` BEGIN UPDATE `stock_revision` SET `rewrites` = `rewrites` + 1 WHERE `id` = 1; END;
