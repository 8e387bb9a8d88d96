-- edition_slot.puzzle_id: text without a foreign key -> integer referencing puzzle(id) (ON DELETE restrict: a
-- puzzle printed in an edition cannot be deleted). The table is rebuilt; every slot whose text id is the digits
-- of a puzzle row is kept, with the same id, position and instructions, and that puzzle's integer id.
-- A slot whose text names no puzzle row cannot satisfy the foreign key and is not copied. Through the API there
-- are none (expected count: 0): updateEdition stores a slot only after the puzzle store found its puzzle, and
-- puzzles are never deleted; only hand-edited data or a stubbed puzzle store could have made one. Such a slot
-- printed nothing (the checks before proof failed it as "puzzle-found"), and every proof keeps its own document.
-- Two slots of one edition spelling the same puzzle ('7' and '007') keep the first (lower position) only, as the
-- unique index (edition_id, puzzle_id) requires. Tested in tests/server/editions/slot-puzzle-fk-migration.test.ts.
PRAGMA foreign_keys=OFF;--> statement-breakpoint
CREATE TABLE `__new_edition_slot` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`edition_id` text NOT NULL,
	`position` integer NOT NULL,
	`puzzle_id` integer NOT NULL,
	`instructions_json` text NOT NULL,
	FOREIGN KEY (`edition_id`) REFERENCES `edition`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`puzzle_id`) REFERENCES `puzzle`(`id`) ON UPDATE no action ON DELETE restrict
);
--> statement-breakpoint
INSERT INTO `__new_edition_slot`("id", "edition_id", "position", "puzzle_id", "instructions_json") SELECT s."id", s."edition_id", s."position", p."id", s."instructions_json" FROM `edition_slot` s JOIN `puzzle` p ON s."puzzle_id" <> '' AND s."puzzle_id" NOT GLOB '*[^0-9]*' AND p."id" = CAST(s."puzzle_id" AS integer) WHERE NOT EXISTS (SELECT 1 FROM `edition_slot` d WHERE d."edition_id" = s."edition_id" AND d."position" < s."position" AND d."puzzle_id" <> '' AND d."puzzle_id" NOT GLOB '*[^0-9]*' AND CAST(d."puzzle_id" AS integer) = p."id");--> statement-breakpoint
DROP TABLE `edition_slot`;--> statement-breakpoint
ALTER TABLE `__new_edition_slot` RENAME TO `edition_slot`;--> statement-breakpoint
PRAGMA foreign_keys=ON;--> statement-breakpoint
CREATE UNIQUE INDEX `edition_slot_position_idx` ON `edition_slot` (`edition_id`,`position`);--> statement-breakpoint
CREATE UNIQUE INDEX `edition_slot_puzzle_idx` ON `edition_slot` (`edition_id`,`puzzle_id`);--> statement-breakpoint
CREATE INDEX `edition_slot_puzzle_lookup_idx` ON `edition_slot` (`puzzle_id`);