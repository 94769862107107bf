import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

/** Path of the numpy/scipy reference scorer. */
export const METRICS_REF_SCRIPT = fileURLToPath(new URL('./metrics_ref.py', import.meta.url));

/**
 * Throws, with what to install, unless python3 with numpy and scipy runs here. Reference tests call
 * it first so a machine without them fails loudly instead of skipping.
 */
export function pythonRefRequire(): void {
  const r = spawnSync('python3', ['-c', 'import numpy, scipy.ndimage; print(numpy.__version__, scipy.__version__)'], { encoding: 'utf8' });
  if (r.error || r.status !== 0) {
    throw new Error(
      'The numpy/scipy reference needs python3 with numpy and scipy: install them with ' +
        '`apt-get install python3 python3-numpy python3-scipy` (or `pip install numpy scipy`). ' +
        `python3 said: ${r.error?.message ?? r.stderr.trim()}`,
    );
  }
}

/** Runs the reference scorer with `args` and returns its parsed JSON report; throws with its stderr on failure. */
export function pythonRefRun(args: string[], timeoutMs = 600_000): Record<string, unknown> {
  const r = spawnSync('python3', [METRICS_REF_SCRIPT, ...args], { encoding: 'utf8', maxBuffer: 1 << 28, timeout: timeoutMs });
  if (r.error || r.status !== 0) throw new Error(`metrics_ref.py ${args.join(' ')} failed: ${r.error?.message ?? r.stderr}`);
  return JSON.parse(r.stdout) as Record<string, unknown>;
}

/**
 * Returns the differences between two report-like JSON values: same keys (except those in `skipKeys`),
 * numbers within `tol`, everything else equal. `error` strings only need to agree on being null or not,
 * since the wording is each program's own. An empty list means they agree.
 */
export function reportDifferences(a: unknown, b: unknown, tol = 1e-9, skipKeys: string[] = ['timing'], path = '$'): string[] {
  if (typeof a === 'number' && typeof b === 'number') {
    return Math.abs(a - b) <= tol ? [] : [`${path}: ${a} vs ${b}`];
  }
  if (a === null || b === null || typeof a !== 'object' || typeof b !== 'object') {
    if (path.endsWith('.error') && typeof a === 'string' && typeof b === 'string') return [];
    return a === b ? [] : [`${path}: ${JSON.stringify(a)} vs ${JSON.stringify(b)}`];
  }
  if (Array.isArray(a) !== Array.isArray(b)) return [`${path}: array vs object`];
  const out: string[] = [];
  if (Array.isArray(a) && Array.isArray(b)) {
    if (a.length !== b.length) return [`${path}: length ${a.length} vs ${b.length}`];
    a.forEach((v, i) => out.push(...reportDifferences(v, b[i], tol, skipKeys, `${path}[${i}]`)));
    return out;
  }
  const ra = a as Record<string, unknown>, rb = b as Record<string, unknown>;
  const keys = new Set([...Object.keys(ra), ...Object.keys(rb)].filter((k) => !skipKeys.includes(k)));
  for (const k of keys) {
    if (!(k in ra) || !(k in rb)) out.push(`${path}.${k}: missing on one side`);
    else out.push(...reportDifferences(ra[k], rb[k], tol, skipKeys, `${path}.${k}`));
  }
  return out;
}
