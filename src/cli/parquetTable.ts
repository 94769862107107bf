// Tables of a results folder as Parquet files (hyparquet-writer / hyparquet): rows are buffered and
// written as a row group whenever the buffer reaches a row or value budget, so memory stays flat
// however many rows a table gets; reading walks a file one row group at a time.
import type { SchemaElement } from 'hyparquet';
import { asyncBufferFromFile, parquetMetadataAsync, parquetReadObjects, parquetSchema } from 'hyparquet';
import { fileWriter, ParquetWriter } from 'hyparquet-writer';

/** A column's type: a number, text or flag (null allowed unless `required`), or a list of whole numbers. */
export type ColumnType = 'int' | 'double' | 'string' | 'boolean' | 'intList';

export interface ColumnSpec {
  name: string;
  type: ColumnType;
  required?: boolean;
}

/** A table being written. */
export interface TableWriter<R> {
  add(row: R): void;
  /** Writes the last row group and the footer; returns the number of rows. */
  close(): number;
}

/** Rows per row group, and values of list columns per row group, before the buffer is written out. */
const GROUP_ROWS = 4096;
const GROUP_LIST_VALUES = 1 << 17;
/** The largest count an intList or int cell can hold (Parquet INT32). */
const INT32_MAX = 2 ** 31 - 1;

function schemaOf(columns: readonly ColumnSpec[]): SchemaElement[] {
  const schema: SchemaElement[] = [{ name: 'root', num_children: columns.length }];
  for (const c of columns) {
    const repetition_type = c.required ? 'REQUIRED' : 'OPTIONAL';
    if (c.type === 'intList') {
      schema.push(
        { name: c.name, repetition_type: 'OPTIONAL', converted_type: 'LIST', num_children: 1 },
        { name: 'list', repetition_type: 'REPEATED', num_children: 1 },
        { name: 'element', type: 'INT32', repetition_type: 'REQUIRED' },
      );
    } else if (c.type === 'string') schema.push({ name: c.name, type: 'BYTE_ARRAY', converted_type: 'UTF8', repetition_type });
    else if (c.type === 'int') schema.push({ name: c.name, type: 'INT32', repetition_type });
    else if (c.type === 'double') schema.push({ name: c.name, type: 'DOUBLE', repetition_type });
    else schema.push({ name: c.name, type: 'BOOLEAN', repetition_type });
  }
  return schema;
}

/** Returns a writer of `columns` into the Parquet file `path` (created or replaced). */
export function tableWriterCreate<R extends object>(path: string, columns: readonly ColumnSpec[], label = path): TableWriter<R> {
  const writer = new ParquetWriter({ writer: fileWriter(path), schema: schemaOf(columns), createdBy: 'hairline' });
  let buffer: unknown[][] = columns.map(() => []);
  let rows = 0, buffered = 0, listValues = 0;
  const flush = () => {
    if (buffered === 0) return;
    writer.write({ columnData: columns.map((c, i) => ({ name: c.name, data: buffer[i] })), rowGroupSize: buffered });
    buffer = columns.map(() => []);
    buffered = 0;
    listValues = 0;
  };
  return {
    add(row) {
      const r = row as Record<string, unknown>;
      columns.forEach((c, i) => {
        const v = r[c.name] ?? null;
        if (v === null && c.required) throw new Error(`${label}: column "${c.name}" has no value`);
        if (c.type === 'intList' && v !== null) {
          const a = v as number[];
          for (const x of a) if (x > INT32_MAX || x < -INT32_MAX - 1) throw new Error(`${label}: column "${c.name}" holds ${x}, beyond a 32-bit count`);
          listValues += a.length;
        } else if (c.type === 'int' && v !== null && ((v as number) > INT32_MAX || (v as number) < -INT32_MAX - 1)) {
          throw new Error(`${label}: column "${c.name}" holds ${v}, beyond a 32-bit count`);
        }
        buffer[i].push(v);
      });
      rows++;
      buffered++;
      if (buffered >= GROUP_ROWS || listValues >= GROUP_LIST_VALUES) flush();
    },
    close() {
      flush();
      writer.finish();
      return rows;
    },
  };
}

/** Yields the rows of a Parquet file one row group at a time, as objects keyed by column name (null where a value is missing). */
export async function* tableRowGroups<R>(path: string): AsyncGenerator<R[]> {
  const file = await asyncBufferFromFile(path);
  const metadata = await parquetMetadataAsync(file);
  const names = parquetSchema(metadata).children.map((c) => c.element.name);
  let start = 0;
  for (const g of metadata.row_groups) {
    const end = start + Number(g.num_rows);
    if (end > start) {
      const rows = await parquetReadObjects({ file, metadata, rowStart: start, rowEnd: end });
      for (const r of rows) for (const n of names) if (r[n] === undefined) r[n] = null;
      yield rows as R[];
    }
    start = end;
  }
}

/** Returns the number of rows of a Parquet file from its footer. */
export async function tableRowCount(path: string): Promise<number> {
  return Number((await parquetMetadataAsync(await asyncBufferFromFile(path))).num_rows);
}
