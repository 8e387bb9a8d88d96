import * as z from 'zod/mini';
import type { CheckResult, Play, RevealResult } from '../../shared/contracts/reader';

// The play script's own parsers, in zod's tree-shakable mini form: the shared contracts
// (shared/contracts/reader.ts) pull the full library and the editions' rich-text schema,
// too heavy for the readers' 120 kB budget. Each schema is checked against the contract's
// type below, so the two cannot drift apart.

const int = z.int();
const num = z.number();
const placement = z.object({ piece: int, x: int, y: int });
const entry = z.object({ square: int, size: int });

export const playSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('assembly'), frame: z.object({ W: int, H: int }), pieces: z.array(int), starters: z.array(placement) }),
  z.object({
    kind: z.literal('deduction'),
    drawing: z.object({ W: num, H: num, rects: z.array(z.object({ x: num, y: num, w: num, h: num })) }),
    labels: z.array(z.string()),
    givens: z.array(entry),
    frame: z.nullable(z.object({ W: int, H: int })),
  }),
]);

/** What a puzzle page hands the play script (server/areas/reader/pages.ts). */
export const pageDataSchema = z.object({
  api: z.string().check(z.startsWith('/api/reader/public/')),
  play: playSchema,
  solutionsPublic: z.boolean(),
  embed: z.boolean(),
});
export type PageData = z.infer<typeof pageDataSchema>;

export const checkResultSchema = z.object({ wrong: z.array(int), solved: z.boolean() });
export const revealResultSchema = z.union([z.object({ placements: z.array(placement) }), z.object({ entries: z.array(entry) })]);

// the parsed types are exactly the contracts' types
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const agree: [Same<z.infer<typeof playSchema>, Play>, Same<z.infer<typeof checkResultSchema>, CheckResult>, Same<z.infer<typeof revealResultSchema>, RevealResult>] = [true, true, true];
void agree;
