import { FlagsPanel } from './FlagsPanel.tsx';
import { FrameList } from './FrameList.tsx';
import { QueuePanel } from './QueuePanel.tsx';
import { useApp, useAppStore } from './storeContext.tsx';

const TABS = [
  ['frames', 'Frames'],
  ['queue', 'Label check'],
  ['flags', 'Flags'],
] as const;

/** The left pane: the frame list, or the dataset-wide queue of likely label mistakes. */
export function LeftPane() {
  const store = useAppStore();
  const tab = useApp((s) => s.leftTab);
  return (
    <div className="left-pane">
      <div className="tabs" role="tablist">
        {TABS.map(([id, label]) => (
          <button key={id} role="tab" aria-selected={tab === id} className={tab === id ? 'tab on' : 'tab'} onClick={() => store.getState().leftTabSet(id)}>
            {label}
          </button>
        ))}
      </div>
      <div className="left-body">{tab === 'frames' ? <FrameList /> : tab === 'queue' ? <QueuePanel /> : <FlagsPanel />}</div>
    </div>
  );
}
