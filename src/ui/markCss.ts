import { MARK_COLORS, type MarkKey } from '../core/composite/compositePalette.ts';

/** Returns the CSS colour (#rrggbb) of overlay mark `key`: the colour the compositor paints it in. */
export function markCss(key: MarkKey): string {
  return `#${MARK_COLORS[key].toString(16).padStart(6, '0')}`;
}
