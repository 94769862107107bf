import { countText } from '../core/countText.ts';
import { fail, ok, type Result } from '../core/result.ts';
import { fileStem } from './frameKeys.ts';
import type { Pairing } from './pairing.ts';

/** Returns the frame keys of a list file: one per line, blank lines and `#` comments ignored, extensions dropped. */
export function frameListParse(text: string): string[] {
  return text
    .split(/\r?\n/)
    .map((l) => l.replace(/#.*$/, '').trim())
    .filter((l) => l !== '')
    .map((l) => fileStem(l.split(/\s+/)[0]));
}

/**
 * Returns the pairing cut down to the frames the list names (still in natural order).
 * A listed key matches a frame name exactly, or the last part of exactly one nested name
 * (`berth001` → `south/berth001`); a key that matches no frame, or several, is an error naming it.
 */
export function pairingListed(pairing: Pairing, keys: string[], file: string): Result<Pairing> {
  const byName = new Map(pairing.frames.map((f) => [f.name, f]));
  const byBase = new Map<string, string[]>();
  for (const f of pairing.frames) {
    const base = f.name.slice(f.name.lastIndexOf('/') + 1);
    (byBase.get(base) ?? byBase.set(base, []).get(base)!).push(f.name);
  }
  const chosen = new Set<string>();
  const missing: string[] = [];
  for (const key of keys) {
    if (byName.has(key)) chosen.add(key);
    else {
      const hits = byBase.get(key.slice(key.lastIndexOf('/') + 1)) ?? [];
      if (hits.length === 1) chosen.add(hits[0]);
      else if (hits.length > 1) return fail(file, `"${key}" could be any of the frames ${hits.join(', ')}; write the full key`);
      else missing.push(key);
    }
  }
  if (missing.length) {
    const more = missing.length > 5 ? ` and ${countText(missing.length - 5)} more` : '';
    return fail(file, `lists ${missing.length === 1 ? 'a frame' : `${countText(missing.length)} frames`} that the dataset does not have: ${missing.slice(0, 5).join(', ')}${more}`);
  }
  if (chosen.size === 0) return fail(file, 'lists no frames (one frame key per line; # starts a comment)');
  return ok({ ...pairing, frames: pairing.frames.filter((f) => chosen.has(f.name)) });
}
