import { useEffect, useRef, useState } from 'react';
import { FLAG_REASONS, isFlagBuiltinReason } from '../core/review/flag.ts';
import { useCommand } from './commands/useCommand.tsx';
import { VERDICT_NAMES } from './regionWords.ts';
import { useApp } from './storeContext.tsx';

/** The small form a new flag goes through: reason (built-in or a tag of the user's own) and a note. */
export function FlagDialog() {
  const run = useCommand();
  const draft = useApp((s) => s.flagDraft);
  const tags = useApp((s) => s.reviewFlags);
  const [reason, setReason] = useState<string>('label-mistake');
  const [tag, setTag] = useState('');
  const [note, setNote] = useState('');
  const [error, setError] = useState<string | null>(null);
  const noteRef = useRef<HTMLTextAreaElement>(null);
  useEffect(() => {
    if (!draft) return;
    setReason(draft.reason || 'label-mistake');
    setNote(draft.note ?? '');
    setTag('');
    setError(null);
    setTimeout(() => noteRef.current?.focus(), 0);
  }, [draft]);
  if (!draft) return null;
  const userTags = [...new Set(tags.map((f) => f.reason).filter((r) => !isFlagBuiltinReason(r)))];
  const save = () => {
    const chosen = reason === '__tag' ? tag.trim() : reason;
    const r = run('flag.save', { reason: chosen, note });
    if (r && !r.ok) setError(r.error);
  };
  const what = draft.kind === 'frame' ? 'the whole frame' : draft.kind === 'rect' ? 'the box you drew' : 'this region';
  return (
    <div className="help-backdrop" onClick={() => run('flag.cancel')}>
      <div
        className="flag-dialog"
        role="dialog"
        aria-label="New flag"
        onClick={(e) => e.stopPropagation()}
        onKeyDown={(e) => {
          if (e.key === 'Escape') run('flag.cancel');
          if (e.key === 'Enter' && (e.ctrlKey || e.metaKey)) save();
          e.stopPropagation();
        }}
      >
        <h3>
          Flag {what} of {draft.frame}
          {draft.bbox ? ` (${draft.bbox.join(', ')})` : ''}
        </h3>
        <div className="reasons">
          {FLAG_REASONS.map((r) => (
            <label key={r}>
              <input type="radio" name="reason" checked={reason === r} onChange={() => setReason(r)} /> {VERDICT_NAMES[r]}
            </label>
          ))}
          {userTags.map((r) => (
            <label key={r}>
              <input type="radio" name="reason" checked={reason === r} onChange={() => setReason(r)} /> {r}
            </label>
          ))}
          <label>
            <input type="radio" name="reason" checked={reason === '__tag'} onChange={() => setReason('__tag')} /> tag:
            <input type="text" value={tag} placeholder="your own tag" onFocus={() => setReason('__tag')} onChange={(e) => setTag(e.currentTarget.value)} />
          </label>
        </div>
        <textarea ref={noteRef} value={note} placeholder="note for the annotators (optional)" rows={3} onChange={(e) => setNote(e.currentTarget.value)} />
        {error && <p className="bad small">{error}</p>}
        <div className="dialog-buttons">
          <button onClick={() => run('flag.cancel')}>cancel</button>
          <button className="primary" onClick={save}>
            save flag (Ctrl+Enter)
          </button>
        </div>
      </div>
    </div>
  );
}
