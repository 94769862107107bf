// A second Parquet reader, independent of the hyparquet code the project reads its tables with:
// parquet-wasm (the Rust parquet crate compiled to WebAssembly) decoding to Apache Arrow.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tableFromIPC } from 'apache-arrow';
import { initSync, readParquet } from 'parquet-wasm/esm';

let ready = false;

/** Returns every row of a Parquet file as plain objects (lists as number arrays, 64-bit ints as numbers). */
export function parquetRowsArrow(path: string): Record<string, unknown>[] {
  if (!ready) {
    const require = createRequire(import.meta.url);
    initSync({ module: readFileSync(require.resolve('parquet-wasm/esm/parquet_wasm_bg.wasm')) });
    ready = true;
  }
  const table = tableFromIPC(readParquet(readFileSync(path)).intoIPCStream());
  const names = table.schema.fields.map((f) => f.name);
  const plain = (v: unknown): unknown => {
    if (v === null || v === undefined) return null;
    if (typeof v === 'bigint') return Number(v);
    if (typeof v === 'object' && v !== null && 'toArray' in v) return Array.from((v as { toArray(): ArrayLike<unknown> }).toArray(), plain);
    return v;
  };
  const out: Record<string, unknown>[] = [];
  for (let i = 0; i < table.numRows; i++) {
    const row: Record<string, unknown> = {};
    for (const n of names) row[n] = plain(table.getChild(n)!.get(i));
    out.push(row);
  }
  return out;
}
