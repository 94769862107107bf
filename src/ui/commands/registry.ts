import type { AppStore } from '../../state/store.ts';

/** What the viewer offers commands (zoom acts on the canvas, which only the viewer knows). */
export interface ViewerControls {
  zoomBy(factor: number): void;
  fit(): void;
  oneToOne(): void;
}

/** What a command acts on: the store, and the viewer when one is mounted. */
export interface CommandContext {
  store: AppStore;
  viewer: ViewerControls | null;
}

/** One user command: defined once, read by buttons, the keyboard and the help overlay. */
export interface Command {
  id: string;
  /** Short label for buttons and the help overlay. */
  label: string;
  /** Group heading in the help overlay. */
  group: string;
  /** Keys in `KeyboardEvent.key` terms, with optional `Shift+` / `Ctrl+` prefixes. */
  keys: string[];
  /** Whether the command can run now. */
  enabled(ctx: CommandContext): boolean;
  run(ctx: CommandContext): void;
}

/** Returns the key chord of a keyboard event in the notation of `Command.keys` (e.g. `Shift+J`). */
export function keyChord(e: Pick<KeyboardEvent, 'key' | 'shiftKey' | 'ctrlKey' | 'metaKey' | 'altKey'>): string {
  let key = e.key.length === 1 ? e.key.toUpperCase() : e.key;
  if (key === ' ') key = 'Space';
  const mods = [e.ctrlKey || e.metaKey ? 'Ctrl' : '', e.altKey ? 'Alt' : '', e.shiftKey && e.key.length !== 1 ? 'Shift' : ''];
  // Printable keys already carry Shift in their character ('?' vs '/'); letters are matched case-blind,
  // so Shift+letter is spelled out explicitly.
  if (e.shiftKey && /^[a-z]$/i.test(e.key)) mods[2] = 'Shift';
  return [...mods.filter(Boolean), key].join('+');
}

/** Returns the command bound to `chord`, if any. */
export function commandForChord(commands: readonly Command[], chord: string): Command | undefined {
  return commands.find((c) => c.keys.includes(chord));
}

/** Returns true when keyboard focus is in a field that takes typed text (commands then stay out of the way). */
export function isTypingTarget(target: EventTarget | null): boolean {
  if (!target || typeof (target as HTMLElement).tagName !== 'string') return false;
  const el = target as HTMLElement;
  const tag = el.tagName;
  if (tag === 'TEXTAREA' || el.isContentEditable) return true;
  if (tag === 'INPUT') {
    const type = (el as HTMLInputElement).type;
    return !['checkbox', 'radio', 'range', 'button', 'color'].includes(type);
  }
  return tag === 'SELECT';
}
