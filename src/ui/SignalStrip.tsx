// The Doubts item's signal strip: one small bar per signal of Hairline's own evidence (its value 0..1),
// coloured by which way it moved the score, with the signal's name and numbers in its tooltip; and the
// legend that says what the letters, heights and colours mean.
import type { SuspectSignals } from '../core/suspects/suspectReasons.ts';
import type { ContributionKey, SuspectContributions } from '../core/suspects/suspectScore.ts';

/** One signal of the strip: the evidence key, its letter, its name, and the score part it feeds. */
interface StripSignal {
  key: keyof SuspectSignals;
  letter: string;
  name: string;
  /** What a high value means, for the tooltip. */
  high: string;
  parts: ContributionKey[];
}

/** The strip's signals in their fixed order (an absent one keeps its place, drawn as a dash). */
export const STRIP_SIGNALS: readonly StripSignal[] = [
  { key: 'agreement', letter: 'A', name: 'run agreement', high: 'the other runs predict the same class here', parts: ['agreement'] },
  { key: 'image', letter: 'E', name: 'image edges', high: 'the predicted outline follows the photo\'s edges better than the label\'s', parts: ['image'] },
  { key: 'temporal', letter: 'F', name: 'label flips over time', high: 'the label changes here for a few frames while the run does not', parts: ['temporal'] },
  { key: 'geometry', letter: 'G', name: 'geometry', high: 'thick and away from label boundaries (not boundary jitter)', parts: ['geometry', 'gate'] },
  { key: 'confidence', letter: 'C', name: 'confidence', high: 'the run is at or above its usual confidence for its class here', parts: ['confidence'] },
  { key: 'appearance', letter: 'P', name: 'appearance', high: 'it looks like the predicted class in the photo, not the labelled one', parts: ['appearance'] },
  { key: 'habit', letter: 'R', name: 'recurrence of the class pair', high: 'the models confuse these two classes in many frames (counts against a label mistake)', parts: ['habit'] },
  { key: 'steady', letter: 'S', name: 'steady disagreement', high: 'the same disagreement under the same label in the frames around (counts against)', parts: ['steady'] },
];

/** Which way a signal moved the score: up (for a label mistake), down, or hardly (|part| < 0.005, as the text leaves out). */
export function stripDirection(parts: SuspectContributions, s: StripSignal): 'up' | 'down' | 'flat' {
  const v = s.parts.reduce((a, k) => a + parts[k], 0);
  return v >= 0.005 ? 'up' : v <= -0.005 ? 'down' : 'flat';
}

const sign = (v: number) => `${v >= 0 ? '+' : '−'}${Math.abs(v).toFixed(2)}`;

/** The strip of one item. */
export function SignalStrip({ signals, parts }: { signals: SuspectSignals; parts: SuspectContributions }) {
  return (
    <div className="qi-strip" role="list" aria-label="signals">
      {STRIP_SIGNALS.map((s) => {
        const v = signals[s.key];
        const dir = stripDirection(parts, s);
        const added = s.parts.reduce((a, k) => a + parts[k], 0);
        const title = v === null
          ? `${s.name}: not measured for this item`
          : `${s.name}: ${v.toFixed(2)} (0..1; high: ${s.high}); moved the score ${sign(added)}`;
        return (
          <span key={s.key} role="listitem" className={`qs-cell qs-${dir}${v === null ? ' qs-absent' : ''}`} data-signal={s.key} data-value={v === null ? '' : String(v)} title={title}>
            <span className="qs-track">{v !== null && <span className="qs-bar" style={{ height: `${Math.max(0, Math.min(1, v)) * 100}%` }} />}</span>
            <span className="qs-letter">{s.letter}</span>
          </span>
        );
      })}
    </div>
  );
}

/** The legend above the list: the letters in order and the colours on one line; opened, each letter's signal. */
export function SignalLegend() {
  return (
    <details className="qs-legend" data-testid="signal-legend">
      <summary>
        signals <b>{STRIP_SIGNALS.map((s) => s.letter).join(' ')}</b> <i className="qs-sw qs-up" /> raised <i className="qs-sw qs-down" /> lowered the score
      </summary>
      <span className="qs-legend-head">Each bar is the signal's value 0..1 (a dash: not measured); its colour, which way it moved the score (grey: hardly).</span>
      {STRIP_SIGNALS.map((s) => (
        <span key={s.key} className="qs-legend-item" data-signal={s.key}>
          <b>{s.letter}</b> {s.name}: high when {s.high}
        </span>
      ))}
    </details>
  );
}
