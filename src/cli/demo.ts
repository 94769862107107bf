// `npx tsx src/cli/demo.ts --out DIR [--size WxH] [--frames N] [--seed S] [--threads N]`: writes the
// Kestrel Quay demo dataset (photos, ground truth with known label mistakes, two prediction runs,
// classes.json, answer-key.json) into DIR.
import { argsParse, UsageError } from './args.ts';
import { demoDatasetWrite } from './demoWrite.ts';
import { demoOptionsCheck, type DemoOptions } from '../demo/options.ts';

const USAGE = 'usage: demo --out DIR [--size WxH] [--frames N] [--seed S] [--threads N]';

/** Returns the demo options named on the command line; throws UsageError on a mistake. */
export function demoArgsParse(argv: string[]): { out: string; options: DemoOptions; threads: number | undefined } {
  const args = argsParse(argv, {
    out: { kind: 'string' },
    size: { kind: 'string' },
    frames: { kind: 'number' },
    seed: { kind: 'number' },
    threads: { kind: 'number' },
  });
  if (args._.length > 0) throw new UsageError(`unexpected argument "${args._[0]}"; ${USAGE}`);
  if (typeof args.out !== 'string' || args.out.trim() === '') throw new UsageError(`--out DIR is required; ${USAGE}`);
  const partial: Partial<DemoOptions> = {};
  if (args.size !== undefined) {
    const m = /^(\d+)[x×](\d+)$/.exec(String(args.size).trim());
    if (!m) throw new UsageError(`--size must look like 1024x512, got "${args.size}"`);
    partial.width = Number(m[1]);
    partial.height = Number(m[2]);
  }
  if (args.frames !== undefined) partial.frames = args.frames as number;
  if (args.seed !== undefined) partial.seed = args.seed as number;
  const checked = demoOptionsCheck(partial, 'demo');
  if (!checked.ok) throw new UsageError(checked.error);
  const threads = args.threads as number | undefined;
  if (threads !== undefined && (!Number.isInteger(threads) || threads < 1 || threads > 64)) {
    throw new UsageError(`--threads must be an integer 1..64, got ${threads}`);
  }
  return { out: args.out, options: checked.value, threads };
}

function plural(n: number, what: string): string {
  return `${n} ${what}${n === 1 ? '' : 's'}`;
}

async function main(): Promise<void> {
  const { out, options, threads } = demoArgsParse(process.argv.slice(2));
  const written = await demoDatasetWrite(out, options, threads);
  if (!written.ok) throw new UsageError(written.error);
  const s = written.value;
  process.stdout.write(
    `wrote ${plural(s.frames, 'frame')} of ${options.width}×${options.height} (seed ${options.seed}) to ${out} ` +
      `with ${plural(s.mistakes, 'known label mistake')} in ${(s.ms / 1000).toFixed(1)} s on ${plural(s.threads, 'thread')}\n`,
  );
}

if (import.meta.url === `file://${process.argv[1]}` || process.argv[1]?.endsWith('/cli/demo.ts')) {
  main().catch((e) => {
    if (e instanceof UsageError) {
      process.stderr.write(`demo: ${e.message}\n`);
      process.exit(1);
    }
    throw e;
  });
}
