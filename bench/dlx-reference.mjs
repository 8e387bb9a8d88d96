// The general exact-cover reference (dancing-links, Knuth's DLX) on a squares-in-a-frame
// problem, as a child process so bench/puzzle.ts can cap its time and memory:
// `node bench/dlx-reference.mjs W H s1,s2,...`. Prints "rows <added> of <total>" while it
// builds the matrix, then "count <solutions> ms <CPU ms>" when it finishes.
import { DancingLinks } from 'dancing-links';

const [W, H] = [Number(process.argv[2]), Number(process.argv[3])];
const pieces = process.argv[4].split(',').map(Number);
const c0 = process.cpuUsage();
let total = 0;
for (const s of pieces) total += (W - s + 1) * (H - s + 1);
const solver = new DancingLinks().createSolver({ columns: W * H + pieces.length });
let rows = 0;
pieces.forEach((s, p) => {
  for (let y = 0; y + s <= H; y++) {
    for (let x = 0; x + s <= W; x++) {
      const cols = [];
      for (let yy = y; yy < y + s; yy++) for (let xx = x; xx < x + s; xx++) cols.push(yy * W + xx);
      cols.push(W * H + p);
      solver.addSparseConstraint(p, cols);
      if (++rows % 2000 === 0) process.stdout.write(`rows ${rows} of ${total}\n`);
    }
  }
});
process.stdout.write(`rows ${rows} of ${total}\n`);
const count = solver.findAll().length;
const c = process.cpuUsage(c0);
process.stdout.write(`count ${count} ms ${((c.user + c.system) / 1000).toFixed(0)}\n`);
