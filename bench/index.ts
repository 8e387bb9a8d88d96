// `npm run bench`: every area's benchmark, ONE AFTER ANOTHER (each module runs on import; the
// next is imported only when the last has finished, so no two ever share the machine).
// `npm run bench -- load intake` runs only the named ones, in the order given.
export {};
const modules: Record<string, () => Promise<unknown>> = {
  foundry: () => import('./foundry'),
  puzzle: () => import('./puzzle'),
  tiling: () => import('./tiling'),
  print: () => import('./print'),
  intake: () => import('./intake'),
  store: () => import('./store'),
  load: () => import('./load'),
};

const asked = process.argv.slice(2);
const unknown = asked.filter((m) => !(m in modules));
if (unknown.length) {
  console.error(`bench: no module ${unknown.join(', ')}; the modules are ${Object.keys(modules).join(', ')}`);
  process.exit(2);
}
for (const name of asked.length ? asked : Object.keys(modules)) {
  console.log(`\n== bench: ${name} ==`);
  await modules[name]!();
}
