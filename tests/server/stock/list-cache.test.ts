import type TestAgent from 'supertest/lib/agent';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseTiling } from '../../../shared/tiling/index';
import { addToStock } from '../../../server/areas/stock/stock';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { order10Codes } from '../../fixtures/intake/order10';

// The stock list answers a repeated page from memory (issue 14: under a foundry run's storing
// every write used to empty that memory). What someone does shows at once; results a job
// stores show within a second.

let t: TestApp;
let editor: TestAgent;
beforeAll(async () => {
  t = await createTestApp();
  editor = await t.signInAs('editor');
});
afterAll(() => t.close());

const total = async () => ((await editor.get('/api/stock?orderMin=10&orderMax=10').expect(200)).body as { total: number }).total;

describe('the stock list page cache', () => {
  it('shows a tiling someone adds at once, and one a job stores within a second', async () => {
    expect(await total()).toBe(0);
    // someone's action (an accepted submission goes this way)
    t.db.transaction((tx) => addToStock(tx, { tiling: parseTiling(order10Codes[0]!), provenance: 'setter' }));
    expect(await total()).toBe(1);
    // a job's result (a foundry run's sink passes background: true)
    t.db.transaction((tx) => addToStock(tx, { tiling: parseTiling(order10Codes[1]!), provenance: 'foundry', background: true }));
    await new Promise((r) => setTimeout(r, 1_100));
    expect(await total()).toBe(2);
    // and someone's action after it shows at once, with the job's result
    t.db.transaction((tx) => addToStock(tx, { tiling: parseTiling(order10Codes[2]!), provenance: 'setter' }));
    expect(await total()).toBe(3);
  });
});
