import { DATASET_COMMANDS } from './datasetCommands.ts';
import { FRAME_COMMANDS } from './frameCommands.ts';
import { LAYER_COMMANDS } from './layerCommands.ts';
import type { AnyCommand, PayloadOf, ReturnOf } from './registry.ts';
import { REVIEW_COMMANDS } from './reviewCommands.ts';
import { VIEW_COMMANDS } from './viewCommands.ts';

/** Every command of the workspace by id, in the order the help overlay lists them. */
export const APP_COMMANDS = { ...FRAME_COMMANDS, ...LAYER_COMMANDS, ...REVIEW_COMMANDS, ...VIEW_COMMANDS, ...DATASET_COMMANDS };
export type AppCommands = typeof APP_COMMANDS;
export type CommandId = keyof AppCommands;
/** The arguments after the id when running command `K`: its payload, or none. */
export type CommandArgs<K extends CommandId> = [PayloadOf<AppCommands[K]>] extends [void] ? [] : [PayloadOf<AppCommands[K]>];
export type CommandReturn<K extends CommandId> = ReturnOf<AppCommands[K]>;

/** Every command as a list (keys and help read it). */
export const APP_COMMAND_LIST: readonly AnyCommand[] = Object.values(APP_COMMANDS);

/** Returns the keys of command `id` (empty for a command run by buttons only). */
export function commandKeys(id: CommandId): readonly string[] {
  return APP_COMMANDS[id].keys;
}
