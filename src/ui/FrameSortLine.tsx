import { CLASS_MEASURE_NAMES } from '../state/classFrames.ts';
import { classInfoSel } from '../state/selectors.ts';
import type { FrameScoreKey } from '../state/viewSlice.ts';
import { commandKeys } from './commands/appCommands.ts';
import { useCommand } from './commands/useCommand.tsx';
import { useApp } from './storeContext.tsx';

const SCORE_NAMES: Record<FrameScoreKey, string> = {
  meanIoU: 'mean IoU', bandIoU: 'band IoU', boundaryIoU: 'Boundary IoU', boundaryF: 'Boundary F', errorPixels: 'wrong pixels', flipBack: 'flip-back', smallObjectRecall: 'small-object recall',
};

/** The frame list's caption: the sort in use (a score column, or a class's measure with a way back). */
export function FrameSortLine() {
  const command = useCommand();
  const key = useApp((s) => s.frameScore);
  const worstFirst = useApp((s) => s.sortWorstFirst);
  const byClass = useApp((s) => s.frameClass);
  const classes = useApp(classInfoSel);
  const order = worstFirst ? 'worst first' : 'best first';
  if (!byClass) {
    return (
      <div className="fl-sort" data-testid="frame-sort" title={`Click a class in the scoreboard or the confusion matrix, or press ${commandKeys('frames.classNext')[0]}, to sort by a class`}>
        sorted by {SCORE_NAMES[key]}, {order}
      </div>
    );
  }
  const c = classes.get(byClass.classId);
  return (
    <div className="fl-sort fl-sort-class" data-testid="frame-sort" data-class={byClass.classId} data-measure={byClass.measure}>
      <span className="swatch" style={{ background: c?.color ?? '#666' }} /> sorted by <b>{c?.name ?? byClass.classId}</b> {CLASS_MEASURE_NAMES[byClass.measure]}, {order}
      <button className="fl-sort-x" title="Back to the list's score columns" aria-label="stop sorting by class" onClick={() => command('frames.byClass', null)}>
        ×
      </button>
    </div>
  );
}
