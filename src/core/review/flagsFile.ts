import { fail, ok, type Result } from '../result.ts';
import { FLAGS_FILE_MAX, type Flag } from './flag.ts';
import { flagFromJson } from './flagCheck.ts';
import { verdictFromJson, type SuspectVerdict } from './verdict.ts';

/**
 * The flags file (our own schema, documented in README "Flags and the tile export"):
 * `{ "format": "hairline-flags", "version": 2, "dataset": { "key", "title", "frames" }, "exportedAt",
 *    "flags": [{ id, frame, kind, bbox, reason, note, run, createdAt, updatedAt, region? }], "verdicts": [...] }`
 * with times as ISO 8601 strings (numbers of ms are read too). Version 1 files hold layout-1 flags.
 */
export const FLAGS_FORMAT = 'hairline-flags';
export const FLAGS_FILE_VERSION = 2;

/** Which dataset a flags file was saved from: its fingerprint, title and number of frames. */
export interface FlagsFileDataset {
  key: string;
  title: string;
  frames: number;
}

/** A flags file read back: flags and verdicts checked, times in ms. */
export interface FlagsFileContent {
  version: number;
  dataset: FlagsFileDataset;
  flags: Flag[];
  verdicts: SuspectVerdict[];
}

/** Most problems listed in one error message. */
const PROBLEMS_SHOWN = 5;

/** Returns the time as ISO 8601; a time no Date can hold (only from storage written by something else) stays a number, so saving never fails. */
function iso(ms: number): string | number {
  const d = new Date(ms);
  return Number.isNaN(d.getTime()) ? ms : d.toISOString();
}

/** Returns the text of a flags file holding `flags` and `verdicts` (flags in the order given). */
export function flagsFileText(dataset: FlagsFileDataset, flags: readonly Flag[], verdicts: readonly SuspectVerdict[], exportedAt: number): string {
  const file = {
    format: FLAGS_FORMAT,
    version: FLAGS_FILE_VERSION,
    dataset: { key: dataset.key, title: dataset.title, frames: dataset.frames },
    exportedAt: iso(exportedAt),
    flags: flags.map((f) => ({
      id: f.id, frame: f.frame, kind: f.kind, bbox: f.bbox, reason: f.reason, note: f.note, run: f.run,
      createdAt: iso(f.createdAt), updatedAt: iso(f.updatedAt), ...(f.region ? { region: f.region } : {}),
    })),
    verdicts: verdicts.map((v) => ({
      key: v.key, frame: v.frame, run: v.run, bbox: v.bbox, truthClass: v.truthClass, predictedClass: v.predictedClass,
      verdict: v.verdict, updatedAt: iso(v.updatedAt),
    })),
  };
  return JSON.stringify(file, null, 2) + '\n';
}

/** Returns ms since the epoch from an ISO 8601 string or a number; leaves anything else for the flag check to name. */
function timeRead(v: unknown): unknown {
  if (typeof v !== 'string') return v;
  const ms = /^\d{4}-\d{2}-\d{2}T/.test(v) ? Date.parse(v) : NaN;
  return Number.isFinite(ms) ? ms : v;
}

function datasetRead(v: unknown): Result<FlagsFileDataset> {
  if (v === undefined || v === null) return fail('', 'has no "dataset" { key, title, frames }');
  const o = v as Record<string, unknown>;
  if (typeof v !== 'object' || Array.isArray(v)) return fail('', '"dataset" must be an object { key, title, frames }');
  if (typeof o.key !== 'string' || typeof o.title !== 'string') return fail('', '"dataset" needs "key" and "title" strings');
  if (typeof o.frames !== 'number' || !Number.isInteger(o.frames) || o.frames < 0) return fail('', `"dataset.frames" must be a whole number, got ${JSON.stringify(o.frames)}`);
  return ok({ key: o.key, title: o.title, frames: o.frames });
}

/**
 * Returns the flags and verdicts of a flags file's text, or an error naming the file and its problems
 * (up to 5). At most FLAGS_FILE_MAX flags and as many verdicts; times from 1970 to at most a day after `now`.
 */
export function flagsFileParse(text: string, file: string, now = Date.now()): Result<FlagsFileContent> {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    return fail(file, `is not valid JSON (${(e as Error).message})`);
  }
  if (typeof json !== 'object' || json === null || Array.isArray(json)) return fail(file, 'is not a flags file: expected a JSON object');
  const o = json as Record<string, unknown>;
  if (o.format !== FLAGS_FORMAT) return fail(file, `is not a flags file: "format" must be "${FLAGS_FORMAT}", got ${JSON.stringify(o.format)}`);
  if (o.version !== FLAGS_FILE_VERSION) {
    const newer = typeof o.version === 'number' && o.version > FLAGS_FILE_VERSION;
    return fail(file, newer ? `was written by a newer version (file version ${o.version}; this one reads ${FLAGS_FILE_VERSION})` : `has "version" ${JSON.stringify(o.version)}; expected ${FLAGS_FILE_VERSION}`);
  }
  const dataset = datasetRead(o.dataset);
  if (!dataset.ok) return fail(file, dataset.error);
  if (!Array.isArray(o.flags)) return fail(file, '"flags" must be an array');
  const verdictsIn = o.verdicts ?? [];
  if (!Array.isArray(verdictsIn)) return fail(file, '"verdicts" must be an array');
  for (const [what, list] of [['flags', o.flags], ['verdicts', verdictsIn]] as const) {
    if (list.length > FLAGS_FILE_MAX) {
      return fail(file, `holds ${list.length.toLocaleString('en-US')} ${what}; at most ${FLAGS_FILE_MAX.toLocaleString('en-US')} are read from one file (split it)`);
    }
  }

  const problems: string[] = [];
  const flags: Flag[] = [];
  const ids = new Map<string, number>();
  o.flags.forEach((raw, i) => {
    const where = `flags[${i}]`;
    const f = flagFromJson(timed(raw, ['createdAt', 'updatedAt']), where, now);
    if (!f.ok) return void problems.push(f.error);
    const prior = ids.get(f.value.id);
    if (prior !== undefined) return void problems.push(`${where}: id ${JSON.stringify(f.value.id)} is used twice (also flags[${prior}])`);
    ids.set(f.value.id, i);
    flags.push(f.value);
  });
  const verdicts: SuspectVerdict[] = [];
  verdictsIn.forEach((raw, i) => {
    const v = verdictFromJson(timed(raw, ['updatedAt']), `verdicts[${i}]`, now);
    if (v.ok) verdicts.push(v.value);
    else problems.push(v.error);
  });
  if (problems.length) {
    const more = problems.length > PROBLEMS_SHOWN ? `; and ${problems.length - PROBLEMS_SHOWN} more` : '';
    const head = problems.length === 1 ? '1 problem' : `${problems.length} problems`;
    return fail(file, `${head}, nothing imported: ${problems.slice(0, PROBLEMS_SHOWN).join('; ')}${more}`);
  }
  return ok({ version: o.version, dataset: dataset.value, flags, verdicts });
}

function timed(raw: unknown, keys: string[]): unknown {
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) return raw;
  const copy: Record<string, unknown> = { ...(raw as Record<string, unknown>) };
  for (const k of keys) copy[k] = timeRead(copy[k]);
  return copy;
}
