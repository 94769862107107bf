// The merge rule is a last-writer-wins register per record (Shapiro, Preguiça, Baquero, Zawirski,
// "Conflict-free Replicated Data Types", SSS 2011, §3.2 LWW-Register): the write with the larger
// timestamp wins, ties broken by a total order on writer ids. Such a merge is commutative, associative
// and idempotent, so every replica (tab) that has seen the same writes holds the same records.
import { describe, expect, it } from 'vitest';
import type { Flag } from '../../../src/core/review/flag.ts';
import {
  reviewRecordFromStored,
  reviewRecordNewer,
  reviewRecordsMerge,
  reviewRecordToStored,
  type ReviewRecord,
} from '../../../src/core/review/reviewRecord.ts';

function flag(id: string, t: number, note = ''): Flag {
  return { id, frame: 'f', kind: 'rect', bbox: [0, 0, 4, 4], reason: 'unsure', note, run: null, createdAt: 1, updatedAt: t };
}
function rec(id: string, t: number, writer: string, note = '', deleted = false): ReviewRecord {
  return { type: 'flag', id, updatedAt: t, writer, flag: deleted ? null : flag(id, t, note) };
}

function seeded(seed: number): () => number {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32);
}

describe('last-write-wins per record', () => {
  it('the later time wins; at equal times the larger writer id wins; a record does not supersede itself', () => {
    expect(reviewRecordNewer(rec('a', 2, 'x'), rec('a', 1, 'z'))).toBe(true);
    expect(reviewRecordNewer(rec('a', 1, 'z'), rec('a', 2, 'x'))).toBe(false);
    expect(reviewRecordNewer(rec('a', 5, 'b'), rec('a', 5, 'a'))).toBe(true);
    expect(reviewRecordNewer(rec('a', 5, 'a'), rec('a', 5, 'b'))).toBe(false);
    const r = rec('a', 5, 'a');
    expect(reviewRecordNewer(r, r)).toBe(false);
  });

  it('a newer tombstone beats an older edit, and a later edit beats an older tombstone', () => {
    const edit = rec('a', 10, 'w1', 'edited');
    const del = rec('a', 11, 'w2', '', true);
    expect(reviewRecordsMerge({ 'flag/a': edit }, [del]).records['flag/a']).toBe(del);
    expect(reviewRecordsMerge({ 'flag/a': del }, [edit]).records['flag/a']).toBe(del);
    const later = rec('a', 12, 'w1', 'again');
    expect(reviewRecordsMerge({ 'flag/a': del }, [later]).records['flag/a']).toBe(later);
  });

  it('merging the same writes in any order, any grouping, any number of times gives the same records', () => {
    const rnd = seeded(7);
    const writes: ReviewRecord[] = [];
    const seen = new Set<string>();
    for (let i = 0; i < 300; i++) {
      const id = `f${Math.floor(rnd() * 12)}`;
      const t = Math.floor(rnd() * 40), writer = `tab${Math.floor(rnd() * 3)}`;
      // A writer stamps each of its versions of a record with a new time, so (id, time, writer) is unique.
      if (seen.has(`${id} ${t} ${writer}`)) continue;
      seen.add(`${id} ${t} ${writer}`);
      writes.push(rec(id, t, writer, `n${i}`, rnd() < 0.2));
    }
    const mergeAll = (order: ReviewRecord[], batch: number) => {
      let cur: Readonly<Record<string, ReviewRecord>> = {};
      for (let i = 0; i < order.length; i += batch) cur = reviewRecordsMerge(cur, order.slice(i, i + batch)).records;
      return cur;
    };
    const first = mergeAll(writes, 1);
    for (let k = 0; k < 20; k++) {
      const shuffled = writes.slice().sort(() => rnd() - 0.5);
      const doubled = [...shuffled, ...shuffled.slice(0, 50)];
      expect(mergeAll(doubled, 1 + Math.floor(rnd() * 30))).toEqual(first);
    }
    // Spot check against the definition: the winner of each id is the max by (time, writer).
    for (const [key, r] of Object.entries(first)) {
      const same = writes.filter((w) => `flag/${w.id}` === key);
      const best = same.reduce((a, b) => (b.updatedAt > a.updatedAt || (b.updatedAt === a.updatedAt && b.writer > a.writer) ? b : a));
      expect([r.updatedAt, r.writer]).toEqual([best.updatedAt, best.writer]);
    }
  });

  it('merge returns the same object when nothing wins and lists exactly the winners', () => {
    const cur = { 'flag/a': rec('a', 5, 'w') };
    const r = reviewRecordsMerge(cur, [rec('a', 4, 'w')]);
    expect(r.records).toBe(cur);
    expect(r.won).toEqual([]);
    const b = rec('b', 1, 'w');
    expect(reviewRecordsMerge(cur, [b]).won).toEqual([b]);
  });
});

describe('stored form', () => {
  it('round-trips through its stored form with the schema version, and refuses other versions and mismatched ids', () => {
    const r = rec('a', 3, 'w', 'x');
    const stored = reviewRecordToStored(r);
    expect(stored.v).toBe(2);
    expect(reviewRecordFromStored(structuredClone(stored), 'k')).toEqual({ ok: true, value: r });
    const tomb = rec('a', 4, 'w', '', true);
    expect(reviewRecordFromStored(reviewRecordToStored(tomb), 'k')).toEqual({ ok: true, value: tomb });
    const v3 = reviewRecordFromStored({ ...stored, v: 3 }, 'flag/a');
    expect(!v3.ok && v3.error).toMatch(/flag\/a: stored with schema 3, this version reads 2/);
    const moved = reviewRecordFromStored({ ...stored, id: 'b' }, 'flag/b');
    expect(!moved.ok && moved.error).toMatch(/holds flag a under id b/);
  });
});
