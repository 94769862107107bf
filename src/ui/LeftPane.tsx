import { FlagsPanel } from './FlagsPanel.tsx';
import { FrameList } from './FrameList.tsx';
import { QueuePanel } from './QueuePanel.tsx';
import { useCommand } from './commands/useCommand.tsx';
import { useApp } from './storeContext.tsx';

const TABS = [
  ['frames', 'Frames'],
  ['queue', 'Doubts'],
  ['flags', 'Flags'],
] as const;

/** The left pane: the frame list, or the dataset-wide queue of likely label mistakes. */
export function LeftPane() {
  const run = useCommand();
  const tab = useApp((s) => s.leftTab);
  return (
    <div className="left-pane">
      <div className="tabs" role="tablist">
        {TABS.map(([id, label]) => (
          <button key={id} role="tab" aria-selected={tab === id} className={tab === id ? 'tab on' : 'tab'} onClick={() => run('pane.left', id)}>
            {label}
          </button>
        ))}
      </div>
      <div className="left-body">{tab === 'frames' ? <FrameList /> : tab === 'queue' ? <QueuePanel /> : <FlagsPanel />}</div>
    </div>
  );
}
