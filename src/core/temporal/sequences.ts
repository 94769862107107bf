/**
 * Video sequences among a dataset's frames (src/docs/metrics.md "Flicker"): frames in the order
 * given (name order), and a sequence is a run of consecutive frames whose keys differ only in their
 * last number, same folder and same text around it. A key with no number is a sequence of its own.
 */

/** A frame's place in its sequence: indices (into the list given) of its neighbours, or null at an end. */
export interface SequencePlace {
  /** Index of the sequence, counting from 0 in frame order. */
  sequence: number;
  prev: number | null;
  next: number | null;
}

const LAST_NUMBER = /(\d+)(?!.*\d)/;

/** Returns the key with its last number taken out (the sequence it belongs to), or null when it has none. */
export function sequenceKeyOf(key: string): string | null {
  const m = LAST_NUMBER.exec(key);
  if (!m) return null;
  return `${key.slice(0, m.index)}\u0000${key.slice(m.index + m[1].length)}`;
}

/** Returns each frame's sequence and neighbours, for frame keys already in name order. */
export function sequencePlaces(keys: readonly string[]): SequencePlace[] {
  const out: SequencePlace[] = [];
  let sequence = -1;
  let prevKey: string | null | undefined;
  for (let i = 0; i < keys.length; i++) {
    const k = sequenceKeyOf(keys[i]);
    const joins = i > 0 && k !== null && k === prevKey;
    if (!joins) sequence++;
    out.push({ sequence, prev: joins ? i - 1 : null, next: null });
    if (joins) out[i - 1].next = i;
    prevKey = k;
  }
  return out;
}
