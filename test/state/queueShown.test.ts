import { describe, expect, it } from 'vitest';
import { suspectRefOf } from '../../src/core/review/judgement.ts';
import { suspectKey, type SuspectVerdict } from '../../src/core/review/verdict.ts';
import type { Suspect } from '../../src/core/suspects/suspectQueue.ts';
import { PANE_WIDTHS_KEY, paneKeep, paneWidthsRead } from '../../src/state/paneKeep.ts';
import { queueShownOf, reviewProgressOf } from '../../src/state/queueShown.ts';
import { QUEUE_VIEW_DEFAULT } from '../../src/state/queueView.ts';
import { appStoreCreate } from '../../src/state/store.ts';
import { PANE_WIDTH_MAX, PANE_WIDTH_MIN, PANE_WIDTHS_DEFAULT } from '../../src/state/viewSlice.ts';
import { APP_COMMANDS } from '../../src/ui/commands/appCommands.ts';
import { commandRun, type AnyCommand } from '../../src/ui/commands/registry.ts';

function item(i: number, score: number, over: Partial<Suspect> = {}): Suspect {
  return {
    frame: `f${i}`, run: 'r1', bbox: [i, 0, i + 4, 4], truthClass: 7, predictedClass: 0, kind: 'classConfusion', score,
    reasons: [], frameIndex: i, regionId: i, alsoRuns: [], merged: [], ...over,
  } as Suspect;
}

function verdictsOf(given: [Suspect, SuspectVerdict['verdict']][]): Record<string, SuspectVerdict> {
  return Object.fromEntries(given.map(([q, verdict]) => {
    const key = suspectKey(suspectRefOf(q));
    return [key, { ...suspectRefOf(q), key, verdict, updatedAt: 1 }];
  }));
}

const queue = [item(0, 0.9), item(1, 0.6, { kind: 'boundary' }), item(2, 0.95, { run: 'r2', alsoRuns: ['r1'] }), item(3, 0.6, { truthClass: 3 })];

describe('queue as shown: filter, order, progress', () => {
  it('keeps the rank order by default and filters by verdict, kind, class pair and run', () => {
    const verdicts = verdictsOf([[queue[0], 'label-mistake'], [queue[3], 'unsure']]);
    expect(queueShownOf(queue, verdicts, QUEUE_VIEW_DEFAULT)).toEqual(queue);
    expect(queueShownOf(queue, verdicts, { ...QUEUE_VIEW_DEFAULT, verdict: 'unjudged' })).toEqual([queue[1], queue[2]]);
    expect(queueShownOf(queue, verdicts, { ...QUEUE_VIEW_DEFAULT, verdict: 'label-mistake' })).toEqual([queue[0]]);
    expect(queueShownOf(queue, verdicts, { ...QUEUE_VIEW_DEFAULT, kind: 'boundary' })).toEqual([queue[1]]);
    expect(queueShownOf(queue, verdicts, { ...QUEUE_VIEW_DEFAULT, pair: '3>0' })).toEqual([queue[3]]);
    // A merged entry counts for every run that found it.
    expect(queueShownOf(queue, verdicts, { ...QUEUE_VIEW_DEFAULT, run: 'r1' })).toEqual(queue);
    expect(queueShownOf(queue, verdicts, { ...QUEUE_VIEW_DEFAULT, run: 'r2' })).toEqual([queue[2]]);
  });

  it('sorts by score either way, ties keeping the rank order', () => {
    const high = queueShownOf(queue, {}, { ...QUEUE_VIEW_DEFAULT, sort: 'score-high' });
    expect(high.map((q) => q.frame)).toEqual(['f2', 'f0', 'f1', 'f3']);
    const low = queueShownOf(queue, {}, { ...QUEUE_VIEW_DEFAULT, sort: 'score-low' });
    expect(low.map((q) => q.frame)).toEqual(['f1', 'f3', 'f0', 'f2']);
  });

  it('counts judged items of the whole queue, per verdict', () => {
    const verdicts = verdictsOf([[queue[0], 'label-mistake'], [queue[2], 'label-mistake'], [queue[3], 'model-error']]);
    expect(reviewProgressOf(queue, verdicts)).toEqual({ judged: 3, total: 4, byVerdict: { 'label-mistake': 2, 'model-error': 1, unsure: 0 } });
  });
});

describe('pane widths: clamped by the command, remembered in storage', () => {
  function memory(): Storage & { data: Map<string, string> } {
    const data = new Map<string, string>();
    return { data, getItem: (k: string) => data.get(k) ?? null, setItem: (k: string, v: string) => void data.set(k, v) } as never;
  }
  const resize = (store: ReturnType<typeof appStoreCreate>, pane: 'left' | 'right', width: number) =>
    commandRun({ store, viewer: null }, APP_COMMANDS['pane.resize'] as AnyCommand, { pane, width });

  it('clamps a dragged width and stores it; a new page restores it', () => {
    const storage = memory();
    const store = appStoreCreate();
    const stop = paneKeep(store, storage);
    expect(store.getState().paneWidths).toEqual(PANE_WIDTHS_DEFAULT);
    resize(store, 'left', 20);
    resize(store, 'right', 5000);
    expect(store.getState().paneWidths).toEqual({ left: PANE_WIDTH_MIN, right: PANE_WIDTH_MAX });
    resize(store, 'left', 444.4);
    stop();
    const again = appStoreCreate();
    paneKeep(again, storage);
    expect(again.getState().paneWidths).toEqual({ left: 444, right: PANE_WIDTH_MAX });
  });

  it('ignores stored widths that are unreadable or out of range', () => {
    const storage = memory();
    storage.setItem(PANE_WIDTHS_KEY, '{not json');
    expect(paneWidthsRead(storage)).toBeNull();
    storage.setItem(PANE_WIDTHS_KEY, JSON.stringify({ left: 5, right: 400 }));
    expect(paneWidthsRead(storage)).toBeNull();
    const store = appStoreCreate();
    paneKeep(store, storage);
    expect(store.getState().paneWidths).toEqual(PANE_WIDTHS_DEFAULT);
  });
});
