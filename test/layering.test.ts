import { readdirSync, readFileSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { describe, expect, it } from 'vitest';
import { importsOf, layerOf, layerViolations, type ImportLine } from './support/importLayers.ts';

// The layer order of src/docs/style.md ("imports point down only, types included"), checked over every
// source file in src/ and app/.

const root = join(import.meta.dirname, '..');

function sourceFiles(dir: string): string[] {
  const out: string[] = [];
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, e.name);
    if (e.isDirectory()) out.push(...sourceFiles(p));
    else if (/\.(ts|tsx|mts|mjs|js)$/.test(e.name)) out.push(p);
  }
  return out;
}

const files = [...sourceFiles(join(root, 'src')), ...sourceFiles(join(root, 'app'))]
  .map((p) => relative(root, p).split(sep).join('/'));

describe('layer order (src/docs/style.md)', () => {
  it('finds the source files of every layer', () => {
    for (const layer of ['src/core', 'src/demo', 'src/workers', 'src/data', 'src/cli', 'src/state', 'src/view', 'src/ui', 'app']) {
      expect(files.some((f) => layerOf(f) === layer), layer).toBe(true);
    }
  });

  it('has no import pointing up, types and re-exports included', () => {
    const imports = files.flatMap((f) => importsOf(f, readFileSync(join(root, f), 'utf8')));
    expect(imports.length).toBeGreaterThan(500);
    const bad = layerViolations(imports);
    expect(bad, `upward imports:\n${bad.join('\n')}`).toEqual([]);
  });

  it('reads every kind of import with its line', () => {
    const text = [
      "import { a } from '../workers/a.ts';",
      "import type { B } from '../state/b.ts';",
      'import {',
      '  c,',
      "} from '../view/c.ts';",
      "export { d } from '../ui/d.ts';",
      "export type { E } from '../../app/e.ts';",
      "const f = await import('../data/f.ts');",
      "// import { g } from '../ui/g.ts';",
      "new Worker(new URL('../workers/w.ts', import.meta.url));",
    ].join('\n');
    expect(importsOf('src/core/x.ts', text).map((i) => [i.line, i.specifier])).toEqual([
      [1, '../workers/a.ts'],
      [2, '../state/b.ts'],
      [5, '../view/c.ts'],
      [6, '../ui/d.ts'],
      [7, '../../app/e.ts'],
      [8, '../data/f.ts'],
      [10, '../workers/w.ts'],
    ]);
  });

  it('names each upward import by file and line, and lets downward ones pass', () => {
    const imports: ImportLine[] = [
      { file: 'src/core/metrics/a.ts', line: 3, specifier: '../../state/store.ts' },
      { file: 'src/core/metrics/a.ts', line: 4, specifier: './b.ts' },
      { file: 'src/demo/frame.ts', line: 7, specifier: '../workers/protocol.ts' },
      { file: 'src/demo/frame.ts', line: 8, specifier: '../core/labelMap.ts' },
      { file: 'src/workers/demo.worker.ts', line: 2, specifier: '../demo/frame.ts' },
      { file: 'src/data/sources/s.ts', line: 9, specifier: '../../cli/args.ts' },
      { file: 'src/cli/score.ts', line: 1, specifier: '../data/pairing.ts' },
      { file: 'src/cli/score.ts', line: 2, specifier: '../state/store.ts' },
      { file: 'src/view/viewer.ts', line: 5, specifier: '../ui/format.ts' },
      { file: 'src/ui/Top.tsx', line: 1, specifier: '../../app/main.tsx' },
      { file: 'app/main.tsx', line: 2, specifier: '../src/ui/Workspace.tsx' },
      { file: 'src/core/png/decode.ts', line: 1, specifier: 'upng-js' },
      { file: 'src/core/png/x.ts', line: 2, specifier: 'node:fs' },
      { file: 'src/state/s.ts', line: 6, specifier: 'pixi.js' },
      { file: 'src/state/s.ts', line: 7, specifier: 'zustand/vanilla' },
      { file: 'src/workers/w.ts', line: 4, specifier: 'left-pad' },
      { file: 'src/cli/serve.ts', line: 3, specifier: 'node:http' },
    ];
    expect(layerViolations(imports)).toEqual([
      'src/core/metrics/a.ts:3: src/core imports src/state/store.ts from src/state, a layer it may not use',
      'src/demo/frame.ts:7: src/demo imports src/workers/protocol.ts from src/workers, a layer it may not use',
      'src/data/sources/s.ts:9: src/data imports src/cli/args.ts from src/cli, a layer it may not use',
      'src/cli/score.ts:2: src/cli imports src/state/store.ts from src/state, a layer it may not use',
      'src/view/viewer.ts:5: src/view imports src/ui/format.ts from src/ui, a layer it may not use',
      'src/ui/Top.tsx:1: src/ui imports app/main.tsx from app, a layer it may not use',
      'src/core/png/x.ts:2: src/core imports "node:fs", usable from src/cli only',
      'src/state/s.ts:6: src/state imports "pixi.js", usable from src/view only',
      'src/workers/w.ts:4: imports package "left-pad", which has no place in the layer order',
    ]);
  });
});
