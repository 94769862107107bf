import { describe, expect, it } from 'vitest';
import type { Flag } from '../../../src/core/review/flag.ts';
import { flagsFileParse, flagsFileText } from '../../../src/core/review/flagsFile.ts';
import { flagsImportPlan } from '../../../src/core/review/flagsImport.ts';
import { flagReasonCounts, flagsByReason, flagsOfFrame, flagsSelect } from '../../../src/core/review/flagsFilter.ts';
import type { ReviewRecord } from '../../../src/core/review/reviewRecord.ts';
import { suspectKey, type SuspectVerdict } from '../../../src/core/review/verdict.ts';

const DS = { key: '3-0badf00d', title: 'Kestrel Quay demo', frames: 3 };
const T0 = Date.UTC(2024, 4, 6, 12, 0, 0, 123);

function flag(id: string, over: Partial<Flag> = {}): Flag {
  return { id, frame: 'kq-0001', kind: 'rect', bbox: [1, 2, 30, 40], reason: 'label-mistake', note: 'a "quoted", note\nwith a line', run: 'run-a', createdAt: T0, updatedAt: T0 + 5, ...over };
}
const VERDICT: SuspectVerdict = (() => {
  const ref = { frame: 'kq-0002', run: 'run-b', bbox: [4, 4, 9, 9] as const, truthClass: 2, predictedClass: 5 };
  return { ...ref, key: suspectKey(ref), verdict: 'model-error', updatedAt: T0 + 9 };
})();

function parseErr(text: string): string {
  const r = flagsFileParse(text, 'flags.json');
  if (r.ok) throw new Error('expected an error');
  return r.error;
}

describe('flags file: write, read back, and clear errors', () => {
  it('round-trips flags (region details included) and verdicts; times are ISO 8601 in the file', () => {
    const flags = [flag('a'), flag('b', { kind: 'frame', bbox: null, reason: 'crane tags', run: null }), flag('c', { kind: 'region', region: { kind: 'suspect', truthClass: 1, predictedClass: 4, score: 0.5, reasons: ['r'] } })];
    const text = flagsFileText(DS, flags, [VERDICT], T0 + 60_000);
    const json = JSON.parse(text);
    expect(json.format).toBe('hairline-flags');
    expect(json.version).toBe(2);
    expect(json.dataset).toEqual(DS);
    // ISO 8601 as ECMAScript's Date.prototype.toISOString writes it (UTC, milliseconds).
    expect(json.flags[0].createdAt).toBe('2024-05-06T12:00:00.123Z');
    expect(json.exportedAt).toBe('2024-05-06T12:01:00.123Z');
    const back = flagsFileParse(text, 'flags.json');
    expect(back).toEqual({ ok: true, value: { version: 2, dataset: DS, flags, verdicts: [VERDICT] } });
  });

  it('refuses a file of another version, saying which it reads', () => {
    const v1 = { format: 'hairline-flags', version: 1, flags: [] };
    expect(flagsFileParse(JSON.stringify(v1), 'old.json')).toEqual({ ok: false, error: 'old.json: has "version" 1; expected 2' });
    const v3 = { format: 'hairline-flags', version: 3, flags: [] };
    expect(flagsFileParse(JSON.stringify(v3), 'new.json')).toEqual({ ok: false, error: 'new.json: was written by a newer version (file version 3; this one reads 2)' });
  });

  it('names the file and what is wrong', () => {
    expect(parseErr('{"format": "hairline-flags",')).toMatch(/^flags\.json: is not valid JSON/);
    expect(parseErr('[]')).toMatch(/^flags\.json: is not a flags file: expected a JSON object/);
    expect(parseErr('{"format":"other","version":2}')).toMatch(/"format" must be "hairline-flags", got "other"/);
    expect(parseErr('{"format":"hairline-flags","version":3,"flags":[]}')).toMatch(/was written by a newer version \(file version 3; this one reads 2\)/);
    expect(parseErr('{"format":"hairline-flags","version":"2"}')).toMatch(/has "version" "2"; expected 2/);
    expect(parseErr('{"format":"hairline-flags","version":2,"flags":[]}')).toMatch(/has no "dataset"/);
    expect(parseErr(JSON.stringify({ format: 'hairline-flags', version: 2, dataset: { ...DS, frames: -1 }, flags: [] }))).toMatch(/"dataset.frames" must be a whole number/);
    expect(parseErr(JSON.stringify({ format: 'hairline-flags', version: 2, dataset: DS, flags: {} }))).toMatch(/"flags" must be an array/);
  });

  it('lists up to five bad flags with their place and id, and imports nothing', () => {
    const flags = Array.from({ length: 8 }, (_, i) => ({ ...flag(`id${i}`), bbox: [5, 5, 5, 9], createdAt: new Date(T0).toISOString() }));
    const msg = parseErr(JSON.stringify({ format: 'hairline-flags', version: 2, dataset: DS, flags }));
    expect(msg).toMatch(/^flags\.json: 8 problems, nothing imported: flags\[0\] \(id "id0"\): "bbox" \[5, 5, 5, 9\] is empty/);
    expect(msg).toMatch(/flags\[4\] \(id "id4"\)/);
    expect(msg).not.toMatch(/flags\[5\]/);
    expect(msg).toMatch(/; and 3 more$/);
    const dup = parseErr(JSON.stringify({ format: 'hairline-flags', version: 2, dataset: DS, flags: [flag('x'), flag('x')] }));
    expect(dup).toMatch(/1 problem, nothing imported: flags\[1\]: id "x" is used twice \(also flags\[0\]\)/);
    const badTime = parseErr(JSON.stringify({ format: 'hairline-flags', version: 2, dataset: DS, flags: [{ ...flag('t'), updatedAt: 'May 6' }] }));
    expect(badTime).toMatch(/"updatedAt" must be a time between 1970 and 2200, got "May 6"/);
  });
});

describe('flagsImportPlan: merge by id, last write wins', () => {
  const here = (f: Flag | null, id: string, t: number): ReviewRecord => ({ type: 'flag', id, updatedAt: t, writer: 'tab', flag: f });

  it('adds new flags, updates older ones, skips newer or equal ones and ones deleted later, and frames not in the dataset', () => {
    const current: Record<string, ReviewRecord> = {
      'flag/old': here(flag('old', { updatedAt: 10 }), 'old', 10),
      'flag/same': here(flag('same', { updatedAt: 50 }), 'same', 50),
      'flag/newer': here(flag('newer', { updatedAt: 90 }), 'newer', 90),
      'flag/gone': here(null, 'gone', 70),
      'flag/goneEarly': here(null, 'goneEarly', 20),
    };
    const incoming = [
      flag('new', { updatedAt: 30 }), flag('old', { updatedAt: 40, note: 'newer text' }), flag('same', { updatedAt: 50 }),
      flag('newer', { updatedAt: 60 }), flag('gone', { updatedAt: 60 }), flag('goneEarly', { updatedAt: 60 }),
      flag('elsewhere', { frame: 'kq-0099', updatedAt: 60 }),
    ];
    const { records, report } = flagsImportPlan(current, { version: 2, dataset: DS, flags: incoming, verdicts: [VERDICT] }, {
      file: 'flags.json', writer: 'me', dataset: DS, frameNames: new Set(['kq-0001', 'kq-0002']),
    });
    expect(report.added).toEqual(['new', 'goneEarly']);
    expect(report.updated).toEqual(['old']);
    expect(report.skipped).toEqual([
      { id: 'same', reason: 'the flag here is as new or newer' },
      { id: 'newer', reason: 'the flag here is as new or newer' },
      { id: 'gone', reason: 'deleted here after this version was saved' },
      { id: 'elsewhere', reason: 'frame "kq-0099" is not in this dataset' },
    ]);
    expect(report.verdictsAdded).toBe(1);
    expect(report.warnings).toEqual([]);
    expect(records.map((r) => `${r.type}/${r.id}@${r.updatedAt}`)).toEqual(['flag/new@30', 'flag/old@40', 'flag/goneEarly@60', `verdict/${VERDICT.key}@${VERDICT.updatedAt}`]);
  });

  it('warns when the file comes from another dataset', () => {
    const { report } = flagsImportPlan({}, { version: 2, dataset: { key: 'x', title: 'other yard', frames: 9 }, flags: [], verdicts: [] }, {
      file: 'f.json', writer: 'me', dataset: DS, frameNames: null,
    });
    expect(report.warnings[0]).toMatch(/f\.json was saved from "other yard" \(9 frames\); the open dataset is "Kestrel Quay demo" \(3 frames\)/);
  });
});

describe('filters', () => {
  const flags = [flag('a'), flag('b', { reason: 'unsure', frame: 'kq-0002' }), flag('c', { reason: 'unsure' }), flag('d', { reason: 'crane' })];
  it('select by reason and by frame; empty lists do not filter', () => {
    expect(flagsSelect(flags).map((f) => f.id)).toEqual(['a', 'b', 'c', 'd']);
    expect(flagsSelect(flags, { reasons: ['unsure', 'crane'] }).map((f) => f.id)).toEqual(['b', 'c', 'd']);
    expect(flagsSelect(flags, { reasons: ['unsure'], frames: ['kq-0001'] }).map((f) => f.id)).toEqual(['c']);
    expect(flagsSelect(flags, { reasons: [], frames: [] }).length).toBe(4);
    expect(flagsByReason(flags, 'crane').map((f) => f.id)).toEqual(['d']);
    expect(flagsOfFrame(flags, 'kq-0002').map((f) => f.id)).toEqual(['b']);
    expect(flagReasonCounts(flags)).toEqual([{ reason: 'unsure', count: 2 }, { reason: 'crane', count: 1 }, { reason: 'label-mistake', count: 1 }]);
  });
});
