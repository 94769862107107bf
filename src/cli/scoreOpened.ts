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

/**
 * Sums each run's id census and the factors its predictions were scaled by over the frames scored;
 * `warnings()` then names runs whose ids do not line up with the truth's, and runs that were scaled.
 */
export function censusKeep(runs: string[]): { add(result: FrameJobResult): void; warnings(): string[] } {
  const sums = new Map<string, IdCensus>(runs.map((r) => [r, idCensusCreate()]));
  const scaled = new Map<string, Map<number, number>>(runs.map((r) => [r, new Map()]));
  const scored = new Map<string, number>(runs.map((r) => [r, 0]));
  return {
    add(result) {
      for (const r of result.runs) {
        if (r.census) idCensusAdd(sums.get(r.run)!, r.census);
        if (r.stats) scored.set(r.run, scored.get(r.run)! + 1);
        if (r.scaledBy) scaled.get(r.run)!.set(r.scaledBy, (scaled.get(r.run)!.get(r.scaledBy) ?? 0) + 1);
      }
    },
    warnings: () =>
      runs.flatMap((r) => {
        const out = idCensusWarnings(r, sums.get(r)!);
        const factors = [...scaled.get(r)!].sort((a, b) => a[0] - b[0]);
        if (factors.length === 1) {
          out.push(`run "${r}": predictions scaled up ×${factors[0][0]} to the label's size by nearest neighbour on ${factors[0][1]} of ${scored.get(r)} frames`);
        } else if (factors.length > 1) {
          const list = factors.map(([k, n]) => `×${k} on ${n} frame${n === 1 ? '' : 's'}`).join(', ');
          out.push(`run "${r}": predictions scaled up to the label's size by different factors (${list}); check that they come from one model setting`);
        }
        return out;
      }),
  };
}
