import { describe, expect, it } from 'vitest';
import { ignoreParse, runsParse, UsageError } from '../../src/cli/args.ts';
import { exportOptionsParse } from '../../src/cli/exportArgs.ts';
import { scoreOptionsParse } from '../../src/cli/scoreArgs.ts';

// The options the scorer and the exporter share are parsed once (src/cli/args.ts): both commands give
// the same runs and the same refusals for the same words.

describe('shared command-line options', () => {
  it('--pred [NAME=]DIR: runs in the order given, a bare folder named after its last part', () => {
    expect(runsParse(['gt/../preds/run-a/', 'b=/x/y'])).toEqual([{ name: 'run-a', dir: 'gt/../preds/run-a/' }, { name: 'b', dir: '/x/y' }]);
    expect(() => runsParse(['/a/r', '/b/r'])).toThrow(new UsageError('two runs are named "r"; name them with --pred NAME=DIR'));
  });

  it('--ignore N: an integer 0..65535 or absent', () => {
    expect([ignoreParse(undefined), ignoreParse(0), ignoreParse(65535)]).toEqual([null, 0, 65535]);
    for (const bad of [-1, 65536, 2.5]) expect(() => ignoreParse(bad)).toThrow(`--ignore must be an integer 0..65535, got ${bad}`);
  });

  it('the scorer and the exporter read them alike', () => {
    const args = ['--truth', 't', '--pred', 'a=p/a', '--pred', 'p/b', '--ignore', '7'];
    const s = scoreOptionsParse(args);
    const e = exportOptionsParse([...args, '--flags', 'f.json', '--out', 'o.zip']);
    expect([s.runs, s.ignore]).toEqual([e.runs, e.ignore]);
    expect(() => scoreOptionsParse([...args, '--pred', 'x/a'])).toThrow('two runs are named "a"');
    expect(() => exportOptionsParse([...args, '--pred', 'x/a', '--flags', 'f.json', '--out', 'o.zip'])).toThrow('two runs are named "a"');
  });
});
