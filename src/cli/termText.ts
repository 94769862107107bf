/**
 * Characters that change what a terminal shows rather than print: C0 controls (ESC starts colour,
 * cursor and title sequences; CR and LF fake new lines), DEL, C1 controls (0x9b is a one-byte CSI),
 * and the Unicode bidi controls that reorder the rest of a line.
 */
// eslint-disable-next-line no-control-regex
const UNSAFE = /[\u0000-\u001f\u007f-\u009f\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069]/g;

/** Returns `text` with every terminal control and bidi control written as a visible escape (`\x1b`, `\n`, `\u202e`), on one line. */
export function termText(text: string): string {
  return text.replace(UNSAFE, (c) => {
    if (c === '\n') return '\\n';
    if (c === '\r') return '\\r';
    if (c === '\t') return '\\t';
    const code = c.charCodeAt(0);
    return code <= 0xff ? `\\x${code.toString(16).padStart(2, '0')}` : `\\u${code.toString(16).padStart(4, '0')}`;
  });
}
