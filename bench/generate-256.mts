// Times generateCloud at 256^3 (lognormal structure, solenoidal turbulence) with 1 and 2 workers.
// Run: npm run build && npx tsx bench/generate-256.mts [cells]
import { parseConfig } from '../src/config/load.js';
import { generateCloud } from '../src/generate/generate-cloud.js';
import { createPool } from '../src/grid/pool.js';

const cells = Number(process.argv[2] ?? 256);
const config = parseConfig({
  seed: 1,
  cloud: { mass: '800 Msun', radius: '0.8 pc', temperature: 15, structure: { kind: 'lognormal' }, turbulence: { mach: 8, solenoidal_weight: 1 } },
  grid: { cells },
});
for (const workers of [1, 2]) {
  const pool = workers > 1 ? createPool(workers) : null;
  const keep = setInterval(() => {}, 1 << 30);
  const t0 = performance.now();
  const cloud = await generateCloud(config, { pool });
  const seconds = (performance.now() - t0) / 1000;
  clearInterval(keep);
  await pool?.close();
  console.log(JSON.stringify({ cells, workers, seconds: Number(seconds.toFixed(2)), rssMiB: Math.round(process.memoryUsage().rss / 2 ** 20), mach: cloud.summary.mach }));
}
