/** A command-line mistake: the CLI prints the message on one line and exits with code 1. */
export class UsageError extends Error {
  override name = 'UsageError';
}

/** Declares one option: its value kind and whether it may repeat. */
export interface OptionSpec {
  kind: 'string' | 'number' | 'flag';
  repeat?: boolean;
}

export type ParsedArgs = Record<string, string | number | boolean | string[] | undefined> & { _: string[] };

/** Returns options parsed from `argv` per `spec` (`--name value`, `--name=value`); throws UsageError on a mistake. */
export function argsParse(argv: string[], spec: Record<string, OptionSpec>): ParsedArgs {
  const out: ParsedArgs = { _: [] };
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    if (!arg.startsWith('--')) {
      out._.push(arg);
      continue;
    }
    const eq = arg.indexOf('=');
    const name = eq > 0 ? arg.slice(2, eq) : arg.slice(2);
    const opt = spec[name];
    if (!opt) throw new UsageError(`unknown option --${name} (known: ${Object.keys(spec).map((k) => '--' + k).join(', ')})`);
    if (opt.kind === 'flag') {
      if (eq > 0) throw new UsageError(`--${name} takes no value`);
      out[name] = true;
      continue;
    }
    let value: string;
    if (eq > 0) value = arg.slice(eq + 1);
    else {
      if (i + 1 >= argv.length || argv[i + 1].startsWith('--')) throw new UsageError(`--${name} needs a value`);
      value = argv[++i];
    }
    if (opt.kind === 'number') {
      const n = Number(value);
      if (value.trim() === '' || !Number.isFinite(n)) throw new UsageError(`--${name} must be a number, got "${value}"`);
      if (opt.repeat) throw new UsageError(`--${name}: repeated numbers are not supported`);
      if (out[name] !== undefined) throw new UsageError(`--${name} given twice`);
      out[name] = n;
    } else if (opt.repeat) {
      ((out[name] as string[] | undefined) ?? (out[name] = [])) as string[];
      (out[name] as string[]).push(value);
    } else {
      if (out[name] !== undefined) throw new UsageError(`--${name} given twice`);
      out[name] = value;
    }
  }
  return out;
}

/** Splits `NAME=DIR` into its parts; a bare `DIR` is named after its last folder. */
export function namedDirParse(value: string, option: string): { name: string; dir: string } {
  const eq = value.indexOf('=');
  if (eq > 0 && !value.slice(0, eq).includes('/')) {
    const name = value.slice(0, eq).trim();
    const dir = value.slice(eq + 1);
    if (!name || !dir) throw new UsageError(`--${option} "${value}": expected NAME=DIR`);
    return { name, dir };
  }
  const parts = value.replace(/[\\/]+$/, '').split(/[\\/]/);
  const name = parts[parts.length - 1];
  if (!name) throw new UsageError(`--${option} "${value}": cannot name a run after this folder; use NAME=DIR`);
  return { name, dir: value };
}

/** Returns the runs of repeated `--pred [NAME=]DIR` in the order given; throws UsageError when two runs share a name. */
export function runsParse(preds: string[] | undefined): { name: string; dir: string }[] {
  const runs = (preds ?? []).map((p) => namedDirParse(p, 'pred'));
  const names = new Set<string>();
  for (const r of runs) {
    if (names.has(r.name)) throw new UsageError(`two runs are named "${r.name}"; name them with --pred NAME=DIR`);
    names.add(r.name);
  }
  return runs;
}

/** Returns `--ignore N` checked (an integer 0..65535), or null when it was not given; throws UsageError otherwise. */
export function ignoreParse(ignore: number | undefined): number | null {
  if (ignore !== undefined && (!Number.isInteger(ignore) || ignore < 0 || ignore > 65535)) throw new UsageError(`--ignore must be an integer 0..65535, got ${ignore}`);
  return ignore ?? null;
}
