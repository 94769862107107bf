// `npm run bench`: every benchmark in turn, each printing its figures (not tests: nothing here fails
// on a slow machine; compare ratios printed within one run). Pass names to run only some:
// npm run bench -- metrics scoreCli
import { spawnSync } from 'node:child_process';

const ALL: [string, string, string[]][] = [
  ['endToEnd', 'test/bench/endToEnd.bench.ts', []],
  ['metrics', 'test/bench/metrics.bench.ts', []],
  ['pngDecode', 'test/bench/pngDecode.bench.ts', []],
  ['scoreCli', 'test/bench/scoreCli.bench.ts', []],
  ['viewerRedraw', 'test/bench/viewerRedraw.bench.ts', []],
  ['workspace', 'test/bench/workspace.bench.ts', []],
  ['regions', 'test/bench/regions.bench.ts', []],
  ['tilesExport', 'test/bench/tilesExport.bench.ts', []],
  ['demo', 'test/bench/demo.bench.ts', []],
  ['largeDataset', 'test/bench/largeDataset.bench.ts', []],
  ['resultsMemory', 'test/bench/resultsMemory.bench.ts', []],
  ['resultsMemory10k', 'test/bench/resultsMemory.bench.ts', ['1000', '10000']],
  ['resultsOpen', 'test/bench/resultsOpen.bench.ts', []],
];
const wanted = process.argv.slice(2);
let failed = 0;
for (const [name, file, args] of ALL) {
  if (wanted.length && !wanted.includes(name)) continue;
  console.log(`\n== ${name} (${file})`);
  const r = spawnSync(process.execPath, ['--import', 'tsx', file, ...args], { stdio: 'inherit' });
  if (r.status !== 0) {
    failed++;
    console.log(`!! ${name} exited with ${r.status}`);
  }
}
process.exit(failed ? 1 : 0);
