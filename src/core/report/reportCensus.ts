// The report's id-census warnings (runs whose ids do not line up with the truth's, runs that were
// scaled up), summed frame by frame: the scorer adds results as they arrive, the page adds the
// results it holds.
import { idCensusAdd, idCensusCreate, idCensusWarnings, type IdCensus } from '../idCensus.ts';

/** What the census needs of a frame's result: each run's census, whether it scored, its scale factor. */
export interface CensusFrame {
  runs: readonly { run: string; census?: IdCensus; stats: unknown; scaledBy?: number }[];
}

/**
 * Sums each run's id census and the factors its predictions were scaled by over the frames scored;
 * `warnings()` then names runs whose ids do not line up with the truth's, and runs that were scaled.
 */
export function censusKeep(runs: string[]): { add(result: CensusFrame): void; warnings(): string[] } {
  const sums = new Map<string, IdCensus>(runs.map((r) => [r, idCensusCreate()]));
  const scaled = new Map<string, Map<number, number>>(runs.map((r) => [r, new Map()]));
  const scored = new Map<string, number>(runs.map((r) => [r, 0]));
  return {
    add(result) {
      for (const r of result.runs) {
        if (!sums.has(r.run)) continue;
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
