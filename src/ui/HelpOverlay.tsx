import { APP_COMMANDS } from './commands/appCommands.ts';
import { useApp, useAppStore } from './storeContext.tsx';

/** Lists every command with its keys, grouped, straight from the command registry. */
export function HelpOverlay() {
  const open = useApp((s) => s.helpOpen);
  const store = useAppStore();
  if (!open) return null;
  const groups = [...new Set(APP_COMMANDS.map((c) => c.group))];
  return (
    <div className="help-backdrop" onClick={() => store.getState().helpOpenSet(false)}>
      <div className="help" role="dialog" aria-label="Keyboard commands" onClick={(e) => e.stopPropagation()}>
        <h2>Keys</h2>
        <div className="help-groups">
          {groups.map((g) => (
            <section key={g}>
              <h3>{g}</h3>
              <table>
                <tbody>
                  {APP_COMMANDS.filter((c) => c.group === g).map((c) => (
                    <tr key={c.id}>
                      <td className="help-keys">
                        {c.keys.map((k) => (
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
        <p className="dim">Press ? or click outside to close.</p>
      </div>
    </div>
  );
}
