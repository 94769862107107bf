import { countText } from '../countText.ts';
import { fail, ok, type Result } from '../result.ts';
import { PNG_IHDR_END, PngColorType, printable, type PngHeader } from './header.ts';
import { upngCrc } from './upng.ts';

/** The chunks a decoder needs after IHDR: the image data pieces and the palette / transparency tables. */
export interface PngChunks {
  /** IDAT data in file order (views into the file, not copies). */
  idat: Uint8Array[];
  /** Total bytes of IDAT data. */
  idatLength: number;
  plte: Uint8Array | null;
  trns: Uint8Array | null;
}

const KNOWN_CRITICAL = new Set(['IHDR', 'PLTE', 'IDAT', 'IEND']);

function isLetter(b: number): boolean {
  return (b >= 65 && b <= 90) || (b >= 97 && b <= 122);
}

/**
 * Walks the chunks after IHDR up to IEND, checking each chunk's CRC; returns the IDAT pieces, PLTE and
 * tRNS, or what is wrong (truncation, a damaged chunk, a missing IDAT/PLTE, an unknown critical chunk).
 */
export function pngChunksRead(bytes: Uint8Array, file: string, header: PngHeader): Result<PngChunks> {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const idat: Uint8Array[] = [];
  let idatLength = 0;
  let plte: Uint8Array | null = null;
  let trns: Uint8Array | null = null;
  let off = PNG_IHDR_END;
  for (;;) {
    if (off + 12 > bytes.length) {
      const where = idat.length === 0 ? 'before any image data' : 'before its end marker (IEND)';
      return fail(file, `is truncated: the file ends ${where}, after ${countText(bytes.length)} bytes`);
    }
    const length = view.getUint32(off);
    const t = bytes.subarray(off + 4, off + 8);
    const type = String.fromCharCode(t[0], t[1], t[2], t[3]);
    if (!isLetter(t[0]) || !isLetter(t[1]) || !isLetter(t[2]) || !isLetter(t[3])) {
      return fail(file, `is damaged: garbage where a chunk should start at byte ${countText(off)} (type "${printable(type)}")`);
    }
    if (length > 0x7fffffff) {
      return fail(file, `is damaged: its ${type} chunk at byte ${countText(off)} claims ${countText(length)} bytes, above PNG's limit of 2^31−1`);
    }
    const end = off + 12 + length;
    if (end > bytes.length) {
      return fail(file, `is truncated: its ${type} chunk needs ${countText(length)} bytes but the file ends after ${countText(bytes.length - off - 8)}`);
    }
    if (view.getUint32(off + 8 + length) !== upngCrc(bytes, off + 4, 4 + length)) {
      return fail(file, `is damaged: its ${type} chunk at byte ${countText(off)} fails its CRC check`);
    }
    const data = bytes.subarray(off + 8, off + 8 + length);
    if (type === 'IEND') break;
    if (type === 'IDAT') {
      idat.push(data);
      idatLength += length;
    } else if (type === 'PLTE') {
      if (length % 3 !== 0 || length === 0 || length > 768) {
        return fail(file, `is damaged: its palette (PLTE) has ${length} bytes; PNG needs 3 per colour, 1 to 256 colours`);
      }
      plte = data;
    } else if (type === 'tRNS') {
      trns = data;
    } else if (type === 'IHDR') {
      return fail(file, 'is damaged: it has a second IHDR header');
    } else if ((t[0] & 0x20) === 0 && !KNOWN_CRITICAL.has(type)) {
      // An uppercase first letter marks a chunk needed to read the image (ISO/IEC 15948 §5.4).
      return fail(file, `uses a "${type}" chunk that is needed to read the image but is not part of PNG (ISO/IEC 15948); re-save it as a standard PNG`);
    }
    off = end;
  }
  if (idat.length === 0) return fail(file, 'is damaged: it has no image data (no IDAT chunk)');
  if (header.colorType === PngColorType.palette && !plte) {
    return fail(file, 'is damaged: it is a palette PNG without a palette (PLTE chunk)');
  }
  return ok({ idat, idatLength, plte, trns });
}
