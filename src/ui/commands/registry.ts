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

/**
 * One user command, defined once: its words, its keys, when it can run, and what it does with its
 * payload (a width, a verdict, a flag draft…), clamping and rules included. Buttons, sliders,
 * checkboxes, keys and the help overlay all go through it. Only a command without a payload
 * (`P = void`) has keys: a key press carries nothing else.
 */
export interface Command<P = void, R = void> {
  id: string;
  /** Short label for buttons and the help overlay. */
  label: string;
  /** Group heading in the help overlay. */
  group: string;
  /** Keys in `KeyboardEvent.key` terms, with optional `Shift+` / `Ctrl+` prefixes. */
  keys: [P] extends [void] ? string[] : [];
  /** Whether the command can run now. */
  enabled(ctx: CommandContext): boolean;
  /** Does the command; what it returns (a problem to show, say) goes back to the caller. */
  run(ctx: CommandContext, payload: P): R;
}

/** A command of any payload, as lists of them hold it. */
export type AnyCommand = Command<any, any>;

/** Returns the payload type of a command. */
export type PayloadOf<C> = C extends Command<infer P, infer _R> ? P : never;
/** Returns what a command's run returns. */
export type ReturnOf<C> = C extends Command<infer _P, infer R> ? R : never;

/** Runs `cmd` with `payload` when it is enabled; returns what it returned, or undefined when it could not run. */
export function commandRun<P, R>(ctx: CommandContext, cmd: Command<P, R>, payload: P): R | undefined {
  if (!cmd.enabled(ctx)) return undefined;
  return cmd.run(ctx, payload);
}

/** Returns the command written without its id, type-checked with its payload `P` and result `R`. */
export function cmd<P = void, R = void>(c: Omit<Command<NoInfer<P>, R>, 'id'>): Omit<Command<P, R>, 'id'> {
  return c;
}

/** Returns `table` with each command's id set to its key (so a table is written without repeating ids). */
export function commandTable<T extends Record<string, { label: string; group: string; keys: readonly string[]; enabled(ctx: CommandContext): boolean }>>(table: T): { [K in keyof T]: T[K] & { id: K & string } } {
  const out: Record<string, unknown> = {};
  for (const [id, c] of Object.entries(table)) out[id] = { ...c, id };
  return out as { [K in keyof T]: T[K] & { id: K & string } };
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
export function commandForChord(commands: readonly AnyCommand[], chord: string): Command | undefined {
  return commands.find((c) => (c.keys as string[]).includes(chord)) as Command | undefined;
}

/**
 * Returns true when keyboard focus is in a field that takes typed text, where keys must type rather
 * than run commands. A drop-down, checkbox, slider or button does not: once used, it keeps focus, and
 * the keys must still work.
 */
export function isTypingTarget(target: EventTarget | null): boolean {
  if (!target || typeof (target as HTMLElement).tagName !== 'string') return false;
  const el = target as HTMLElement;
  const tag = el.tagName;
  if (tag === 'TEXTAREA' || el.isContentEditable) return true;
  if (tag === 'INPUT') {
    const type = (el as HTMLInputElement).type;
    return !['checkbox', 'radio', 'range', 'button', 'submit', 'reset', 'color', 'file'].includes(type);
  }
  return false;
}
