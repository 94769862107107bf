import { classTableGenerated, type ClassTable } from './classTable.ts';
import { fail, ok, type Result } from './result.ts';

/**
 * Returns the class table frames are scored with, given the dataset's table (null without a
 * classes.json) and the void id chosen in the settings or on the command line. Without a table the
 * classes are generated (named by number, the ids present on each frame). A void id that is the id
 * of a class is refused, naming the class: its pixels would silently stop counting (src/docs/metrics.md).
 * The page and the command line both build their tables here; `source` names the table in messages.
 */
export function scoringTableBuild(table: ClassTable | null, ignore: number, source = 'classes.json'): Result<ClassTable> {
  if (!table) return ok(classTableGenerated(-1, ignore));
  if (ignore === table.ignore) return ok(table);
  const clash = table.classes.find((c) => c.id === ignore);
  if (clash) return fail('', `void id ${ignore} is the id of class "${clash.name}" in ${source}; choose another void id`);
  return ok({ ...table, ignore });
}
