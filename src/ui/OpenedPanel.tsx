import { useCommand } from './commands/useCommand.tsx';
import { ambiguityText } from '../data/opened.ts';
import { useApp } from './storeContext.tsx';

/** Up to this many unpaired files are listed in the panel before the rest are counted. */
const UNPAIRED_SHOWN = 200;

/**
 * A line under the top bar saying what was opened (frames, runs, photos) with the warnings in view,
 * and a panel listing how the files paired: encodings chosen, id maps, warnings, files left out.
 */
export function OpenedNotice() {
  const opened = useApp((s) => s.dataset?.opened ?? null);
  const open = useApp((s) => s.dialog === 'opened');
  const run = useCommand();
  if (!opened) return null;
  const problems = opened.warnings.length + opened.ambiguous.length;
  const counts = [
    `${opened.frames} frame${opened.frames === 1 ? '' : 's'}`,
    `${opened.runs.length} run${opened.runs.length === 1 ? '' : 's'}`,
    `${opened.photos} with photos`,
  ].join(' · ');
  return (
    <>
      <div className={problems ? 'opened-notice has-warnings' : 'opened-notice'} role={problems ? 'alert' : 'status'}>
        <span>Opened {counts}{opened.how ? ` (folders by ${opened.how})` : ''}</span>
        {problems > 0 && <span className="warn">⚠ {problems} warning{problems === 1 ? '' : 's'}: {opened.ambiguous.length ? 'files that could pair with more than one frame' : opened.warnings[0]}</span>}
        {opened.unpaired.length > 0 && <span className="dim">{opened.unpaired.length} file{opened.unpaired.length === 1 ? '' : 's'} not paired</span>}
        <button className="link" onClick={() => run('dialog.opened')}>{open ? 'hide' : 'what was opened'}</button>
      </div>
      {open && <OpenedPanel onClose={() => run('dialog.close')} />}
    </>
  );
}

function OpenedPanel({ onClose }: { onClose: () => void }) {
  const opened = useApp((s) => s.dataset?.opened ?? null);
  if (!opened) return null;
  return (
    <div className="opened-panel" role="dialog" aria-label="What was opened">
      <div className="opened-head">
        <h3>What was opened</h3>
        <button onClick={onClose}>close</button>
      </div>
      <p>
        {opened.frames} frames paired by frame key, runs {opened.runs.map((r) => `"${r}"`).join(', ') || 'none'}, {opened.photos} frames with a photo.
        {opened.how && ` Folders found by ${opened.how}.`}
      </p>
      {opened.warnings.length > 0 && <Section title="Warnings" lines={opened.warnings} className="warn" />}
      {opened.ambiguous.length > 0 && <Section title="Not paired: could pair with more than one frame" lines={opened.ambiguous.map(ambiguityText)} className="warn" />}
      {opened.groups.length > 0 && <Section title="Several encodings per frame" lines={opened.groups} />}
      <Section title="Id maps" lines={opened.idMaps.length ? opened.idMaps : ['none: the files store class ids']} />
      {opened.unpaired.length > 0 && (
        <Section
          title={`Files not paired (${opened.unpaired.length})`}
          lines={[
            ...opened.unpaired.slice(0, UNPAIRED_SHOWN).map((u) => `${u.folder}/${u.file}: ${u.reason}`),
            ...(opened.unpaired.length > UNPAIRED_SHOWN ? [`… and ${opened.unpaired.length - UNPAIRED_SHOWN} more`] : []),
          ]}
        />
      )}
    </div>
  );
}

function Section({ title, lines, className }: { title: string; lines: string[]; className?: string }) {
  return (
    <section>
      <h4>{title}</h4>
      <ul className={className}>
        {lines.map((l, i) => (
          <li key={i}>{l}</li>
        ))}
      </ul>
    </section>
  );
}
