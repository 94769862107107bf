// The layering rule of src/docs/style.md as data, and a scanner that lists every import of a source
// file (value and type imports, `export … from`, dynamic `import()`, `new URL(…, import.meta.url)`
// worker references) with its line, so test/layering.test.ts can name each upward import.
import ts from 'typescript';
import { posix } from 'node:path';

/** The folders of src/docs/style.md's layer order, plus the two that sit beside it. */
export const LAYERS = ['src/core', 'src/demo', 'src/workers', 'src/data', 'src/cli', 'src/state', 'src/view', 'src/ui', 'app'] as const;
export type Layer = (typeof LAYERS)[number];

/** For each layer, the layers its files may import (its own included). */
export const LAYER_MAY_IMPORT: Record<Layer, readonly Layer[]> = {
  'src/core': ['src/core'],
  'src/demo': ['src/core', 'src/demo'],
  'src/workers': ['src/core', 'src/demo', 'src/workers'],
  'src/data': ['src/core', 'src/demo', 'src/workers', 'src/data'],
  'src/cli': ['src/core', 'src/demo', 'src/workers', 'src/data', 'src/cli'],
  'src/state': ['src/core', 'src/demo', 'src/workers', 'src/data', 'src/state'],
  'src/view': ['src/core', 'src/demo', 'src/workers', 'src/data', 'src/state', 'src/view'],
  'src/ui': ['src/core', 'src/demo', 'src/workers', 'src/data', 'src/state', 'src/view', 'src/ui'],
  'app': ['src/core', 'src/demo', 'src/workers', 'src/data', 'src/state', 'src/view', 'src/ui', 'app'],
};

/**
 * The lowest layer each outside package may be used from: React only in the UI, pixi.js from the
 * view, zustand and IndexedDB from state, Node's modules and the dev server only in the CLI. A package
 * missing here is an error, so a new dependency gets a place in the order when it arrives.
 */
export const PACKAGE_LOWEST_LAYER: Record<string, Layer> = {
  'fflate': 'src/core',
  'hyparquet': 'src/core',
  'hyparquet-writer': 'src/core',
  'upng-js': 'src/core',
  'culori': 'src/core',
  'zod': 'src/data',
  'jpeg-js': 'src/cli',
  'zustand': 'src/state',
  'idb-keyval': 'src/state',
  'pixi.js': 'src/view',
  'react': 'src/ui',
  'react-dom': 'src/ui',
  'uplot': 'src/ui',
  'node': 'src/cli',
  'vite': 'src/cli',
  'tsx': 'src/cli',
};

/** One import of a source file: the file and line it is on (1-based) and what it names. */
export interface ImportLine {
  file: string;
  line: number;
  specifier: string;
}

/** Returns the layer a repository path (posix, relative to the root) belongs to, or null outside them. */
export function layerOf(path: string): Layer | null {
  let best: Layer | null = null;
  for (const l of LAYERS) if ((path === l || path.startsWith(`${l}/`)) && (!best || l.length > best.length)) best = l;
  return best;
}

/** Returns every import of one file's text, each with its 1-based line. */
export function importsOf(file: string, text: string): ImportLine[] {
  const info = ts.preProcessFile(text, true, true);
  const lineAt = (pos: number) => text.slice(0, pos).split('\n').length;
  const out: ImportLine[] = info.importedFiles.map((f) => ({ file, line: lineAt(f.pos), specifier: f.fileName }));
  // Worker entry points are referenced by URL, not imported; they are dependencies all the same (a
  // URL of a folder or a data file is not code).
  for (const m of text.matchAll(/new URL\(\s*['"]([^'"]+\.(?:[mc]?[jt]sx?))['"]\s*,\s*import\.meta\.url/g)) {
    out.push({ file, line: lineAt(m.index), specifier: m[1] });
  }
  return out;
}

/** The package name an import names (`node:fs/promises` → `node`, `zustand/vanilla` → `zustand`). */
function packageOf(specifier: string): string {
  if (specifier.startsWith('node:')) return 'node';
  const parts = specifier.split('/');
  return specifier.startsWith('@') ? parts.slice(0, 2).join('/') : parts[0];
}

/** Returns one message per import that breaks the layer order, as `file:line: …`. */
export function layerViolations(imports: readonly ImportLine[]): string[] {
  const out: string[] = [];
  for (const imp of imports) {
    const from = layerOf(imp.file);
    if (!from) continue;
    const { specifier } = imp;
    if (specifier.startsWith('.')) {
      const target = posix.normalize(posix.join(posix.dirname(imp.file), specifier));
      const to = layerOf(target);
      if (to && !LAYER_MAY_IMPORT[from].includes(to)) {
        out.push(`${imp.file}:${imp.line}: ${from} imports ${target} from ${to}, a layer it may not use`);
      } else if (!to) {
        out.push(`${imp.file}:${imp.line}: ${from} imports ${target}, outside every layer`);
      }
      continue;
    }
    const pkg = packageOf(specifier);
    const lowest = PACKAGE_LOWEST_LAYER[pkg];
    if (!lowest) out.push(`${imp.file}:${imp.line}: imports package "${pkg}", which has no place in the layer order`);
    else if (lowest === 'src/cli' ? from !== 'src/cli' : !LAYER_MAY_IMPORT[from].includes(lowest)) {
      out.push(`${imp.file}:${imp.line}: ${from} imports "${specifier}", usable from ${lowest} only`);
    }
  }
  return out;
}
