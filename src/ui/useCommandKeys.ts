import { useEffect } from 'react';
import { APP_COMMANDS } from './commands/appCommands.ts';
import { commandForChord, isTypingTarget, keyChord, type CommandContext } from './commands/registry.ts';

/** Runs the registry's command bound to each key pressed on the page (outside text fields). */
export function useCommandKeys(context: () => CommandContext): void {
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (isTypingTarget(e.target)) return;
      const cmd = commandForChord(APP_COMMANDS, keyChord(e));
      if (!cmd) return;
      const ctx = context();
      if (!cmd.enabled(ctx)) return;
      e.preventDefault();
      cmd.run(ctx);
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [context]);
}
