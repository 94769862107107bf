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
