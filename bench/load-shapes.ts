// The stock list's filter shapes the load bench drives (bench/load-driver.ts) and warms up with
// (bench/load.ts): each draws its parameters (pages, ranges) from the generator it is given.
export const stockListShapes: ((rnd: () => number) => string)[] = [
  (rnd) => `/api/stock?orderMin=${20 + Math.floor(rnd() * 8)}&orderMax=${28 + Math.floor(rnd() * 8)}&page=${1 + Math.floor(rnd() * 20)}`,
  (rnd) => `/api/stock?provenance=foundry&sort=-width&page=${1 + Math.floor(rnd() * 50)}`,
  (rnd) => `/api/stock?perfect=true&simple=true&used=unused&sort=order&page=${1 + Math.floor(rnd() * 5)}`,
  (rnd) => `/api/stock?widthMin=${Math.floor(rnd() * 500000)}&heightMax=400000&sort=-createdAt&pageSize=50`,
  (rnd) => `/api/stock?square=false&orderMin=30&page=${1 + Math.floor(rnd() * 10)}`,
];
