import { eq } from 'drizzle-orm';
import { canonicalKey, classifyTiling, solvePlaneNetwork, toBouwkamp, wheel, type PlaneGraph, type Tiling } from '../../../shared/tiling/index';
import { user } from '../../platform/auth/schema';
import type { Db } from '../../platform/db/client';
import { demoAccounts } from '../accounts/index';
import type { IntakeDeps } from './ports';
import { createSubmission, reviewSubmission, type IntakeStore } from './submissions';

// Demo stock made by OUR engine: c-nets built as wheels with chords across the rim face,
// solved by Kirchhoff's laws (solvePlaneNetwork) for every pole edge, deduplicated by
// canonical key. Nothing is copied from a catalogue.

/**
 * The wheel W_k (hub 0, rim 1..k) with chords (a, b) across its rim face, as a rotation
 * system. Chords must be non-crossing with distinct endpoints; each chord is inserted into
 * the wedge of the rim face at both ends (between the two rim neighbours).
 */
export function wheelWithChords(k: number, chords: readonly (readonly [number, number])[]): PlaneGraph {
  const { adj } = wheel(k);
  for (const [a, b] of chords) {
    adj[a]!.splice(2, 0, b);
    adj[b]!.splice(2, 0, a);
  }
  return { n: k + 1, adj };
}

/** Non-crossing chord sets with distinct endpoints on the rim of W_k, at most `max` chords, in a fixed order. */
export function* chordSets(k: number, max: number): Generator<[number, number][]> {
  const all: [number, number][] = [];
  for (let a = 1; a <= k; a++) for (let b = a + 2; b <= k; b++) if (!(a === 1 && b === k) && k - (b - a) >= 2) all.push([a, b]);
  const crosses = ([a, b]: [number, number], [c, d]: [number, number]) => (a < c && c < b && b < d) || (c < a && a < d && d < b);
  function* rec(from: number, chosen: [number, number][], used: Set<number>): Generator<[number, number][]> {
    if (chosen.length > 0) yield chosen.slice();
    if (chosen.length === max) return;
    for (let i = from; i < all.length; i++) {
      const ch = all[i]!;
      if (used.has(ch[0]) || used.has(ch[1]) || chosen.some((o) => crosses(o, ch))) continue;
      used.add(ch[0]).add(ch[1]);
      chosen.push(ch);
      yield* rec(i + 1, chosen, used);
      chosen.pop();
      used.delete(ch[0]);
      used.delete(ch[1]);
    }
  }
  yield* rec(0, [], new Set());
}

export interface MadeTiling {
  tiling: Tiling;
  key: string;
  params: { graph: string; pole: [number, number] };
}

/** Distinct tilings from wheels k = kMin.. with chord sets, every pole edge in both senses, in a fixed order. */
export function* wheelChordTilings(kMin: number, kMax: number, maxChords: number): Generator<MadeTiling> {
  const seen = new Set<string>();
  for (let k = kMin; k <= kMax; k++) {
    for (const chords of chordSets(k, maxChords)) {
      const g = wheelWithChords(k, chords);
      for (let p = 0; p < g.n; p++) {
        for (const q of g.adj[p]!) {
          const r = solvePlaneNetwork(g, { p, q });
          if (!r.ok) continue;
          const key = canonicalKey(r.tiling);
          if (seen.has(key)) continue;
          seen.add(key);
          yield { tiling: r.tiling, key, params: { graph: `wheel ${k} + chords ${chords.map((c) => c.join('-')).join(' ')}`, pole: [p, q] } };
        }
      }
    }
  }
}

/** About 20 demo tilings: perfect ones of small size first, plus a few imperfect and compound ones for the filters. */
export function demoStockTilings(): { stock: MadeTiling[]; forSubmissions: MadeTiling[] } {
  const made = [...wheelChordTilings(6, 9, 2)];
  const size = (m: MadeTiling) => Math.max(m.tiling.W, m.tiling.H);
  const cls = new Map(made.map((m) => [m.key, classifyTiling(m.tiling)]));
  const perfect = made.filter((m) => cls.get(m.key)!.perfect && cls.get(m.key)!.simple).sort((a, b) => size(a) - size(b) || (a.key < b.key ? -1 : 1));
  const other = made.filter((m) => !cls.get(m.key)!.perfect || !cls.get(m.key)!.simple).sort((a, b) => size(a) - size(b) || (a.key < b.key ? -1 : 1));
  return { stock: [...perfect.slice(0, 16), ...other.slice(0, 4)], forSubmissions: perfect.slice(16, 20) };
}

const titles = ['Harbour lights', 'Quill and square', 'Larkspur corner', 'Saturday stack'];

export function seedDemoStock(deps: IntakeDeps): void {
  const db: Db = deps.db;
  const { stock, forSubmissions } = demoStockTilings();
  db.transaction((tx) => {
    for (const m of stock) deps.stock.add(tx, { tiling: m.tiling, provenance: 'demo', params: m.params });
  });
  const setterEmail = demoAccounts.find((a) => a.role === 'setter')?.email;
  const editorEmail = demoAccounts.find((a) => a.role === 'editor')?.email;
  const setter = setterEmail ? db.select({ id: user.id }).from(user).where(eq(user.email, setterEmail)).get() : undefined;
  const editor = editorEmail ? db.select({ id: user.id }).from(user).where(eq(user.email, editorEmail)).get() : undefined;
  if (!setter) return;
  forSubmissions.forEach((m, i) => {
    const s = createSubmission(deps, { id: setter.id, role: 'setter' }, { code: toBouwkamp(m.tiling, { header: true }), title: titles[i % titles.length], source: 'paste' });
    // the first one went through review already, so the setter's list and the stock show both states
    if (i === 0 && editor) {
      reviewSubmission(deps, { id: editor.id, role: 'editor' }, s.id, 'accept', 'Clean and clear: into the stock for the Saturday column.', {
        publicUrl: deps.env.PUBLIC_URL,
        now: () => deps.clock.now(),
      });
    }
  });
}

/**
 * Two tilings side by side, scaled to the same height: A scaled by H_B/g next to B scaled
 * by H_A/g (g = gcd of the heights). The result is a valid (compound) tiling.
 */
export function sideBySide(a: Tiling, b: Tiling): Tiling {
  const gcd = (x: number, y: number): number => (y === 0 ? x : gcd(y, x % y));
  const g = gcd(a.H, b.H);
  const sa = b.H / g;
  const sb = a.H / g;
  const squares = [
    ...a.squares.map((q) => ({ x: q.x * sa, y: q.y * sa, s: q.s * sa })),
    ...b.squares.map((q) => ({ x: a.W * sa + q.x * sb, y: q.y * sb, s: q.s * sb })),
  ];
  return { W: a.W * sa + b.W * sb, H: a.H * sa, squares };
}

/**
 * Fill a stock for load tests: `n` distinct tilings made by our engine, the simple ones from
 * wheels with chords and the rest as pairs of them side by side. One transaction. Returns
 * how many rows were created.
 */
export function seedBulkStock(deps: IntakeStore, n: number): number {
  const { db } = deps;
  const bases: Tiling[] = [];
  for (const m of wheelChordTilings(6, 12, 2)) {
    bases.push(m.tiling);
    if (bases.length * (bases.length - 1) / 2 + bases.length >= n * 1.05) break;
  }
  let created = 0;
  const provenances = ['foundry', 'demo', 'setter'] as const;
  db.transaction((tx) => {
    for (const t of bases) {
      if (created >= n) break;
      if (deps.stock.add(tx, { tiling: t, provenance: 'foundry', params: { bulk: true } }).created) created++;
    }
    for (let i = 0; i < bases.length && created < n; i++) {
      for (let j = i + 1; j < bases.length && created < n; j++) {
        const t = sideBySide(bases[i]!, bases[j]!);
        if (deps.stock.add(tx, { tiling: t, provenance: provenances[(i + j) % 3]!, params: { bulk: true, pair: [i, j] } }).created) created++;
      }
    }
  });
  return created;
}
