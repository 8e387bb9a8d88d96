import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { exhaustiveTilings, randomTilings, type FoundTiling } from '../../../shared/foundry/index';
import { runRequestSchema, type RunRequest } from '../../../shared/contracts/foundry';
import { user } from '../../platform/auth/schema';
import { job } from '../../platform/jobs/schema';
import type { Db } from '../../platform/db/client';
import type { StockPort } from '../stock/ports';
import { demoAccounts } from '../accounts/index';
import type { FoundryItem } from './run-job';
import type { FoundryDeps } from './ports';
import { FOUNDRY_KIND, storeItems } from './runs';

// Demo data from the foundry: two finished runs recorded as if the demo editor had started
// them (deterministic: exhaustive order 10, and random orders 13..17 with small sides from
// seed 2026), their tilings in the stock with provenance 'foundry'. Runs in the main thread
// at first start (well under a second).

function record(stock: StockPort, db: Db, request: RunRequest, createdBy: string | null, run: (found: (t: FoundTiling) => void) => object): void {
  const params = runRequestSchema.parse(request);
  const id = randomUUID();
  const items: FoundryItem[] = [];
  const started = new Date();
  const summary = run((t) => items.push(t));
  db.transaction((tx) => {
    tx.insert(job).values({ id, kind: FOUNDRY_KIND, state: 'done', params: JSON.stringify(params), createdBy, startedAt: started, finishedAt: new Date(), summary: JSON.stringify(summary), progress: JSON.stringify({ phase: 'done', done: items.length, total: items.length, found: items.length }) }).run();
    storeItems(stock, tx, id, params, items);
  });
}

export function seedDemoFoundry(deps: FoundryDeps): void {
  const db = deps.db;
  const editorEmail = demoAccounts.find((a) => a.role === 'editor')?.email;
  const editor = editorEmail ? db.select({ id: user.id }).from(user).where(eq(user.email, editorEmail)).get() : undefined;
  const by = editor?.id ?? null;
  record(deps.stock, db, { mode: 'exhaustive', order: 10, squaresOnly: false, includeImperfect: false }, by, (found) => exhaustiveTilings({ order: 10, onFound: (t) => { if (t.perfect) found(t); } }));
  const known = new Set(deps.stock.allKeys(db));
  const request = { mode: 'random', count: 8, orderMin: 13, orderMax: 17, maxSide: 150, squaresOnly: false, seed: 2026 } as const;
  record(deps.stock, db, request, by, (found) => randomTilings({ ...request, isKnown: (k) => known.has(k), onFound: found }));
}
