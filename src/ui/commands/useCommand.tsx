import { createContext, useCallback, useContext, useEffect, type ReactNode } from 'react';
import { useStore } from 'zustand';
import { APP_COMMAND_LIST, APP_COMMANDS, type CommandArgs, type CommandId, type CommandReturn } from './appCommands.ts';
import { commandForChord, commandRun, isTypingTarget, keyChord, type AnyCommand, type CommandContext } from './registry.ts';

const CommandContextOf = createContext<(() => CommandContext) | null>(null);

/** Gives every component below the context commands run in (the store, and the viewer once mounted). */
export function CommandProvider({ context, children }: { context: () => CommandContext; children: ReactNode }) {
  return <CommandContextOf.Provider value={context}>{children}</CommandContextOf.Provider>;
}

function useContextFn(): () => CommandContext {
  const context = useContext(CommandContextOf);
  if (!context) throw new Error('useCommand outside CommandProvider');
  return context;
}

/** Returns `run(id, payload)`: runs the registry's command (when enabled) and returns what it returned. The one way the UI changes state. */
export function useCommand(): <K extends CommandId>(id: K, ...args: CommandArgs<K>) => CommandReturn<K> | undefined {
  const context = useContextFn();
  return useCallback(
    <K extends CommandId>(id: K, ...args: CommandArgs<K>) => commandRun(context(), APP_COMMANDS[id] as AnyCommand, args[0]) as CommandReturn<K> | undefined,
    [context],
  );
}

/** Returns whether command `id` can run now (re-rendering when that changes). */
export function useCommandEnabled(id: CommandId): boolean {
  const context = useContextFn();
  return useStore(context().store, () => (APP_COMMANDS[id] as AnyCommand).enabled(context()));
}

/** Runs the registry's command bound to each key pressed on the page (outside fields that take typed text). */
export function useCommandKeys(): void {
  const context = useContextFn();
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (isTypingTarget(e.target)) return;
      const cmd = commandForChord(APP_COMMAND_LIST, keyChord(e));
      if (!cmd) return;
      const ctx = context();
      if (!cmd.enabled(ctx)) return;
      e.preventDefault();
      void cmd.run(ctx);
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [context]);
}
