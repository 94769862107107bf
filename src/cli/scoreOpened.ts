import type { FrameJobResult } from '../core/frameJob.ts';
import { idCensusAdd, idCensusCreate, idCensusWarnings, type IdCensus } from '../core/idCensus.ts';
import { ambiguityMessage, unpairedLines } from '../data/opened.ts';
import { groupChoiceText } from '../data/labelGroups.ts';
import type { Pairing } from '../data/pairing.ts';
import { UsageError } from './args.ts';
import { termText } from './termText.ts';

/**
 * Writes to stderr what pairing did (unpaired files capped at 20 lines, suffix-group choices,
 * pairing warnings); throws UsageError listing the candidates when a file could pair with more than one frame.
 */
export function pairingReport(pairing: Pairing, writeLine: (line: string) => void): void {
  const ambiguous = pairing.ambiguous ?? [];
  if (ambiguous.length) throw new UsageError(ambiguityMessage(ambiguous).split('\n').map(termText).join('\n'));
  for (const line of unpairedLines(pairing.unpaired)) writeLine(line);
  for (const g of pairing.groups ?? []) writeLine(`note: ${groupChoiceText(g)}`);
  for (const w of pairing.warnings ?? []) writeLine(`warning: ${w}`);
}

/** Sums each run's id census over the frames scored; `warnings()` then names runs whose ids do not line up with the truth's. */
export function censusKeep(runs: string[]): { add(result: FrameJobResult): void; warnings(): string[] } {
  const sums = new Map<string, IdCensus>(runs.map((r) => [r, idCensusCreate()]));
  return {
    add(result) {
      for (const r of result.runs) if (r.census) idCensusAdd(sums.get(r.run)!, r.census);
    },
    warnings: () => runs.flatMap((r) => idCensusWarnings(r, sums.get(r)!)),
  };
}
