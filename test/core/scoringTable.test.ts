import { describe, expect, it } from 'vitest';
import { classTableFromText } from '../../src/core/classTable.ts';
import { scoringTableBuild } from '../../src/core/scoringTable.ts';

// The one scoring-table rule of the app and the command line (src/docs/metrics.md, "ignore"): the
// dataset's table with the chosen void id, a generated table without one, and a void id that is the
// id of a class refused with its name.

const text = JSON.stringify({ ignore: 255, classes: [{ id: 0, name: 'sky', color: '#102030' }, { id: 4, name: 'crane', color: '#405060' }] });
const table = (() => {
  const r = classTableFromText(text, 'classes.json');
  if (!r.ok) throw new Error(r.error);
  return r.value;
})();

describe('scoringTableBuild (src/core/scoringTable.ts)', () => {
  it('keeps the table as it is when the void id is its own', () => {
    expect(scoringTableBuild(table, 255)).toEqual({ ok: true, value: table });
  });

  it('takes another void id that is no class, keeping every class', () => {
    const r = scoringTableBuild(table, 9);
    expect(r.ok && [r.value.ignore, r.value.classes.map((c) => c.id), r.value.generated]).toEqual([9, [0, 4], false]);
  });

  it('refuses a void id that is a class id, naming the class and the table', () => {
    expect(scoringTableBuild(table, 4, 'data/classes.json')).toEqual({
      ok: false, error: 'void id 4 is the id of class "crane" in data/classes.json; choose another void id',
    });
  });

  it('without a table: a generated one with that void id (classes are the ids present on each frame)', () => {
    expect(scoringTableBuild(null, 4)).toEqual({ ok: true, value: { ignore: 4, ignoreColor: null, classes: [], generated: true } });
  });
});
