import { readFile } from 'node:fs/promises';
import { classTableFromText, type ClassTable } from '../core/classTable.ts';
import { scoringTableBuild } from '../core/scoringTable.ts';
import { UsageError } from './args.ts';

/**
 * Returns the table frames are scored and cut with: --classes FILE read and checked, with --ignore N
 * applied by the same rule as the app (scoringTableBuild: a void id that is a class id is refused,
 * naming the class); without --classes a generated table. Throws UsageError saying what is wrong.
 */
export async function classTableRead(classes: string | null, ignore: number | null): Promise<ClassTable> {
  let table: ClassTable | null = null;
  if (classes) {
    let text: string;
    try {
      text = await readFile(classes, 'utf8');
    } catch (e) {
      throw new UsageError(`--classes ${classes}: cannot read (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
    }
    const r = classTableFromText(text, classes);
    if (!r.ok) throw new UsageError(r.error);
    table = r.value;
  }
  const built = scoringTableBuild(table, ignore ?? table?.ignore ?? 255, classes ?? 'classes.json');
  if (!built.ok) throw new UsageError(`--ignore ${ignore}: ${built.error}`);
  return built.value;
}
