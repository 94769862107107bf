import type { ScopeScores } from '../state/scopeScores.ts';
import { compareCountsSel, scopesASel, scopesBSel } from '../state/selectors.ts';
import { count, pct } from './format.ts';
import { useCommand } from './commands/useCommand.tsx';
import { useApp } from './storeContext.tsx';

function delta(a: number | null | undefined, b: number | null | undefined): string {
  if (a === null || a === undefined || b === null || b === undefined) return '';
  const d = (b - a) * 100;
  return `${d >= 0 ? '+' : ''}${d.toFixed(1)}`;
}

function Row({ label, a, b }: { label: string; a: number | null | undefined; b: number | null | undefined }) {
  const d = a != null && b != null ? b - a : 0;
  return (
    <tr>
      <td>{label}</td>
      <td>{pct(a)}</td>
      <td>{pct(b)}</td>
      <td className={d > 0.0005 ? 'better' : d < -0.0005 ? 'worse' : ''}>{delta(a, b)}</td>
    </tr>
  );
}

function Side({ a, b, scope }: { a: ScopeScores | null; b: ScopeScores | null; scope: string }) {
  const rows = a?.rows ?? [];
  const bRows = new Map((b?.rows ?? []).map((r) => [r.id, r]));
  return (
    <table className="classes" data-testid={`compare-${scope}`}>
      <thead>
        <tr>
          <th>{scope}</th>
          <th>A</th>
          <th>B</th>
          <th>B − A</th>
        </tr>
      </thead>
      <tbody>
        <Row label="mean IoU" a={a?.meanIoU} b={b?.meanIoU} />
        <Row label="band IoU" a={a?.bandIoU} b={b?.bandIoU} />
        <Row label="Boundary IoU" a={a?.boundaryIoU} b={b?.boundaryIoU} />
        <Row label="Boundary F" a={a?.boundaryF} b={b?.boundaryF} />
        {rows.map((r) => (
          <Row key={r.id} label={`${r.name} IoU`} a={r.iou} b={bRows.get(r.id)?.iou} />
        ))}
      </tbody>
    </table>
  );
}

/** Runs A and B side by side: dataset and frame scores, and on this frame the pixels B fixed and broke. */
export function CompareTab({ runA, runB }: { runA: string | null; runB: string | null }) {
  const run = useCommand();
  const runs = useApp((s) => s.dataset?.pairing.runs);
  const A = useApp(scopesASel);
  const B = useApp(scopesBSel);
  const counts = useApp(compareCountsSel);
  if (!runB || !runA) {
    const other = runs?.find((r) => r !== runA);
    return (
      <div>
        <p className="dim">Choose a run to compare with run A in the bar at the top.</p>
        {other && (
          <button
            onClick={() => run('run.b', other)}
          >
            compare {runA} with {other}
          </button>
        )}
      </div>
    );
  }
  return (
    <div className="compare">
      <p>
        A = <b>{runA}</b>, B = <b>{runB}</b>
      </p>
      {counts && (
        <p data-testid="fixed-broke">
          This frame: <span className="fixed">B fixed {count(counts.fixed)} px</span>, <span className="broke">B broke {count(counts.broke)} px</span>, both wrong{' '}
          {count(counts.bothWrong)} px of {count(counts.valid)} valid.
        </p>
      )}
      <Side a={A.dataset} b={B.dataset} scope="dataset" />
      <Side a={A.frame} b={B.frame} scope="this frame" />
    </div>
  );
}
