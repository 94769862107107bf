import { describe, expect, it } from 'vitest';
import { idCensusAdd, idCensusCreate, idCensusOf, idCensusWarnings } from '../../src/core/idCensus.ts';
import { randomPair } from '../support/randomMaps.ts';

// The traps are common practice to check for: a run counting classes from 0 against truth counting from 1,
// and a run in another id space altogether; both score a mean IoU near 0 with no error.

const ids = [1, 2, 3, 4, 5];

function censusOf(shift: number, seed: number) {
  const { truth, pred } = randomPair(40, 30, seed, { classIds: ids, ignore: 255, voids: true, shapes: 10 });
  return idCensusOf(truth, { ...pred, ids: pred.ids.map((v) => v + shift) }, 255);
}

describe('idCensus', () => {
  it('counts equal, +1 and −1 pixels over non-void truth, as a plain loop does', () => {
    const { truth, pred } = randomPair(33, 21, 3, { classIds: ids, ignore: 255, voids: true });
    const c = idCensusOf(truth, pred, 255);
    let valid = 0, same = 0, up = 0, down = 0;
    truth.ids.forEach((t, i) => {
      if (t === 255) return;
      valid++;
      const p = pred.ids[i];
      if (p === t) same++;
      else if (p === t + 1) up++;
      else if (p === t - 1) down++;
    });
    expect([c.valid, c.same, c.up, c.down]).toEqual([valid, same, up, down]);
  });

  it('no warning for a run in the truth id space', () => {
    const total = idCensusAdd(idCensusAdd(idCensusCreate(), censusOf(0, 1)), censusOf(0, 2));
    expect(idCensusWarnings('good', total)).toEqual([]);
  });

  it('names a shift by one in either direction', () => {
    expect(idCensusWarnings('r', censusOf(-1, 1))[0]).toMatch(/^run "r": predicted ids look shifted by one against the truth \(prediction = truth − 1/);
    expect(idCensusWarnings('r', censusOf(1, 1))[0]).toMatch(/prediction = truth \+ 1/);
  });

  it('names ids that barely overlap, with both id ranges', () => {
    const w = idCensusWarnings('far', censusOf(100, 5));
    expect(w).toHaveLength(1);
    expect(w[0]).toMatch(/^run "far": predicted ids and truth ids barely overlap \(only 0% of .* truth ids [1-5, ]+, predicted ids 101, 102, 103, 104, 105\)/);
  });
});
