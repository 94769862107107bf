// `npm start [-- DATASET_DIR [--results DIR]] [--port N] [--no-build]`: builds the app and serves it on
// 127.0.0.1, with DATASET_DIR (if given) read-only under /dataset/ and a results folder of it
// (npm run score --results) under /results/, shown at once without scoring again. Without a dataset
// the app opens the demo.
import { stat } from 'node:fs/promises';
import { fileURLToPath } from 'node:url';
import { build } from 'vite';
import { appServerStart } from './appServer.ts';
import { argsParse, UsageError } from './args.ts';
import { termText } from './termText.ts';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));

async function main(): Promise<void> {
  const args = argsParse(process.argv.slice(2), { port: { kind: 'number' }, 'no-build': { kind: 'flag' }, results: { kind: 'string' } });
  if (args._.length > 1) throw new UsageError(`give at most one dataset folder, got ${args._.length}`);
  const dataset = args._[0] ?? null;
  if (dataset) {
    const info = await stat(dataset).catch(() => null);
    if (!info?.isDirectory()) throw new UsageError(`${dataset}: not a folder`);
  }
  const results = (args.results as string | undefined) ?? null;
  if (results) {
    if (!dataset) throw new UsageError('--results needs the dataset folder the results were scored from: npm start -- DATASET --results DIR');
    const info = await stat(results).catch(() => null);
    if (!info?.isDirectory()) throw new UsageError(`--results ${results}: not a folder`);
    if (!(await stat(`${results}/summary.json`).catch(() => null))?.isFile()) throw new UsageError(`--results ${results}: not a results folder (no summary.json); write one with npm run score -- --results DIR`);
  }
  const port = (args.port as number | undefined) ?? 5173;
  if (!Number.isInteger(port) || port < 0 || port > 65535) throw new UsageError(`--port must be 0..65535, got ${port}`);
  if (!args['no-build']) {
    process.stderr.write('building the app…\n');
    await build({ configFile: `${ROOT}/vite.config.ts`, logLevel: 'warn' });
  } else if (!(await stat(`${ROOT}/dist/index.html`).catch(() => null))?.isFile()) {
    throw new UsageError('--no-build: there is no built app in dist/ yet; run npm start once without --no-build');
  }
  const { url, skipped } = await appServerStart({ appDir: `${ROOT}/dist`, datasetDir: dataset, resultsDir: results, port });
  process.stdout.write(`Hairline is serving ${dataset ? `dataset ${termText(dataset)}` : 'the Kestrel Quay demo'}${results ? ` with results ${termText(results)}` : ''} at ${url}\n`);
  process.stdout.write('Only this machine can reach it (127.0.0.1), and only pages it serves itself. Press Ctrl+C to stop.\n');
  const left = await skipped();
  if (left.length) {
    process.stderr.write(`${left.length} file${left.length === 1 ? '' : 's'} of the folder will not be served:\n`);
    for (const f of left.slice(0, 20)) process.stderr.write(`  ${termText(f.path)}: ${f.reason}\n`);
    if (left.length > 20) process.stderr.write(`  … and ${left.length - 20} more\n`);
  }
}

main().catch((e) => {
  if (e instanceof UsageError || (e as NodeJS.ErrnoException).code === 'EADDRINUSE') {
    process.stderr.write(`hairline start: ${termText((e as Error).message)}\n`);
    process.exit(1);
  }
  throw e;
});
