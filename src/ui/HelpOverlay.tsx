import { APP_COMMAND_LIST } from './commands/appCommands.ts';
import { useCommand } from './commands/useCommand.tsx';
import { useApp } from './storeContext.tsx';

/** The commands that have keys, in registry order. */
const KEYED = APP_COMMAND_LIST.filter((c) => c.keys.length > 0);

/** Lists every command with its keys, grouped, straight from the command registry. */
export function HelpOverlay() {
  const open = useApp((s) => s.helpOpen);
  const run = useCommand();
  if (!open) return null;
  const groups = [...new Set(KEYED.map((c) => c.group))];
  return (
    <div className="help-backdrop" onClick={() => run('help')}>
      <div className="help" role="dialog" aria-label="Keyboard commands" onClick={(e) => e.stopPropagation()}>
        <h2>Keys</h2>
        <div className="help-groups">
          {groups.map((g) => (
            <section key={g}>
              <h3>{g}</h3>
              <table>
                <tbody>
                  {KEYED.filter((c) => c.group === g).map((c) => (
                    <tr key={c.id}>
                      <td className="help-keys">
                        {(c.keys as string[]).map((k) => (
                          <kbd key={k}>{k.replace('Arrow', '').replace('Space', 'space')}</kbd>
                        ))}
                      </td>
                      <td>{c.label}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </section>
          ))}
        </div>
        <p className="dim">Press ? or Esc, or click outside, to close. Esc closes any form or dialog.</p>
      </div>
    </div>
  );
}
