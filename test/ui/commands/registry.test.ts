import { describe, expect, it } from 'vitest';
import { BAND_WIDTH_MAX } from '../../../src/core/metrics/bandHistogram.ts';
import { REVIEW_JUDGEMENTS, suspectRefOf } from '../../../src/core/review/judgement.ts';
import { suspectKey } from '../../../src/core/review/verdict.ts';
import type { Suspect } from '../../../src/core/suspects/suspectQueue.ts';
import { appStoreCreate, type AppStore } from '../../../src/state/store.ts';
import { APP_COMMAND_LIST, APP_COMMANDS, type CommandArgs, type CommandId, type CommandReturn } from '../../../src/ui/commands/appCommands.ts';
import { commandForChord, commandRun, isTypingTarget, keyChord, type AnyCommand } from '../../../src/ui/commands/registry.ts';

function storeWith(frames: number, runs = ['r1', 'r2'], table = false): AppStore {
  const store = appStoreCreate();
  const list = Array.from({ length: frames }, (_, i) => ({ name: `f${i}`, image: null, truth: `f${i}.png`, predictions: {}, confidence: {} }));
  const classTable = table ? { ignore: 255, generated: false, classes: [{ id: 0, name: 'quay', color: '#808080' }, { id: 7, name: 'crane', color: '#ffcc00' }] } : null;
  store.setState({
    dataset: { key: 'k', title: 't', source: { kind: 'demo' } as never, pairing: { frames: list, runs, unpaired: [] }, table: classTable as never, tableError: null },
  });
  store.getState().runsSet({ runA: runs[0] ?? null });
  return store;
}

/** Runs a command as a button or key does (only when enabled); returns what it returned. */
function run<K extends CommandId>(store: AppStore, id: K, ...args: CommandArgs<K>): CommandReturn<K> | undefined {
  return commandRun({ store, viewer: null }, APP_COMMANDS[id] as AnyCommand, args[0]) as CommandReturn<K> | undefined;
}
const enabled = (store: AppStore, id: CommandId) => (APP_COMMANDS[id] as AnyCommand).enabled({ store, viewer: null });

function item(frameIndex: number, over: Partial<Suspect> = {}): Suspect {
  return {
    frame: `f${frameIndex}`, run: 'r1', bbox: [4, 6, 20, 30], truthClass: 7, predictedClass: 0, kind: 'classConfusion', score: 0.8,
    reasons: ['both runs agree on quay'], frameIndex, regionId: 3, alsoRuns: [], merged: [], ...over,
  } as Suspect;
}

describe('command registry: keys', () => {
  it('spells key chords the way commands list them', () => {
    const k = (key: string, mods: Partial<Record<'shiftKey' | 'ctrlKey' | 'metaKey' | 'altKey', boolean>> = {}) =>
      keyChord({ key, shiftKey: false, ctrlKey: false, metaKey: false, altKey: false, ...mods });
    expect(k('j')).toBe('J');
    expect(k('Q', { shiftKey: true })).toBe('Shift+Q');
    expect(k('?', { shiftKey: true })).toBe('?');
    expect(k(' ')).toBe('Space');
    expect(k('z', { ctrlKey: true })).toBe('Ctrl+Z');
    expect(k('Z', { ctrlKey: true, shiftKey: true })).toBe('Ctrl+Shift+Z');
    expect(k('z', { metaKey: true })).toBe('Ctrl+Z');
    expect(k('ArrowRight')).toBe('ArrowRight');
  });

  it('binds every chord to one command, names each command by its id, and finds the command of a chord', () => {
    const chords = APP_COMMAND_LIST.flatMap((c) => c.keys as string[]);
    expect(new Set(chords).size).toBe(chords.length);
    for (const [id, c] of Object.entries(APP_COMMANDS)) expect(c.id).toBe(id);
    expect(commandForChord(APP_COMMAND_LIST, 'Shift+M')?.id).toBe('flag.selected');
    expect(commandForChord(APP_COMMAND_LIST, '6')?.id).toBe('layer.band');
    expect(commandForChord(APP_COMMAND_LIST, 'Ctrl+Y')?.id).toBe('review.redo');
    expect(commandForChord(APP_COMMAND_LIST, 'Shift+J')).toBeUndefined();
    // Each review judgement has its key.
    for (const v of REVIEW_JUDGEMENTS) expect(APP_COMMANDS[`verdict.${v}`].keys.length).toBe(1);
  });

  it('lets keys through from drop-downs, checkboxes and sliders, and keeps them out of text fields', () => {
    const el = (tagName: string, type = '', isContentEditable = false) => ({ tagName, type, isContentEditable }) as unknown as EventTarget;
    expect(isTypingTarget(el('SELECT'))).toBe(false);
    expect(isTypingTarget(el('INPUT', 'checkbox'))).toBe(false);
    expect(isTypingTarget(el('INPUT', 'range'))).toBe(false);
    expect(isTypingTarget(el('BUTTON'))).toBe(false);
    expect(isTypingTarget(el('INPUT', 'text'))).toBe(true);
    expect(isTypingTarget(el('INPUT', 'number'))).toBe(true);
    expect(isTypingTarget(el('TEXTAREA'))).toBe(true);
    expect(isTypingTarget(el('DIV', '', true))).toBe(true);
    expect(isTypingTarget(null)).toBe(false);
  });
});

describe('command registry: enabled-when', () => {
  it('frame, layer and flag commands need frames; a command that is not enabled does nothing', () => {
    const store = appStoreCreate();
    for (const id of ['frame.next', 'layer.band', 'band.wider', 'flag.frame', 'play.toggle'] as const) expect(enabled(store, id)).toBe(false);
    expect(run(store, 'play.toggle')).toBeUndefined();
    expect(store.getState().playing).toBe(false);
    expect(enabled(store, 'help')).toBe(true);
  });

  it('run commands need runs, verdict keys a selected item, Escape something to stop, undo a change to undo', () => {
    const store = storeWith(3, ['r1']);
    expect(enabled(store, 'run.next')).toBe(false);
    expect(enabled(store, 'run.swap')).toBe(false);
    expect(enabled(store, 'verdict.label-mistake')).toBe(false);
    expect(enabled(store, 'flag.selected')).toBe(false);
    expect(enabled(store, 'overlay.close')).toBe(false);
    expect(enabled(store, 'review.undo')).toBe(false);
    run(store, 'layer.only', 7);
    expect(enabled(store, 'overlay.close')).toBe(true);
    run(store, 'overlay.close');
    expect(store.getState().layers.solo.on).toBe(false);
    const two = storeWith(3, ['r1', 'r2']);
    run(two, 'run.b', 'r2');
    expect(enabled(two, 'run.swap')).toBe(true);
    run(two, 'region.focus', { frameIndex: 1, bbox: [0, 0, 4, 4] });
    expect(enabled(two, 'flag.selected')).toBe(true);
  });
});

describe('command registry: payloads and their rules', () => {
  it('clamps the band width to 0..BAND_WIDTH_MAX whoever sets it: slider, curve, keys', () => {
    const store = storeWith(2);
    run(store, 'band.width', 12.4);
    expect(store.getState().bandWidth).toBe(12);
    run(store, 'band.width', 500);
    expect(store.getState().bandWidth).toBe(BAND_WIDTH_MAX);
    run(store, 'band.wider');
    expect(store.getState().bandWidth).toBe(BAND_WIDTH_MAX);
    run(store, 'band.width', -3);
    expect(store.getState().bandWidth).toBe(0);
    run(store, 'band.narrower');
    expect(store.getState().bandWidth).toBe(0);
    run(store, 'band.wider');
    expect(store.getState().bandWidth).toBe(1);
  });

  it('switches layers and sets opacity within 0..255; the curtain brings truth and prediction with it', () => {
    const store = storeWith(2);
    run(store, 'layer.set', { layer: 'truth', opacity: 300 });
    expect(store.getState().layers.truth.opacity).toBe(255);
    expect(store.getState().layers.truth.on).toBe(false);
    run(store, 'layer.band');
    expect(store.getState().layers.band.on).toBe(true);
    store.setState({ results: [{ name: 'f0', width: 40, height: 10, error: null, runs: [] }, undefined] as never });
    run(store, 'curtain.toggle');
    expect(store.getState().layers.curtain).toEqual({ on: true, x: 20 });
    expect(store.getState().layers.truth.on && store.getState().layers.pred.on).toBe(true);
    run(store, 'curtain.set', { x: 7 });
    expect(store.getState().layers.curtain).toEqual({ on: true, x: 7 });
    run(store, 'curtain.set', { on: false });
    expect(store.getState().layers.curtain.on).toBe(false);
    // Closing puts the switches back: the curtain turned truth and prediction on, so they go off again;
    // a layer that was on before stays on.
    expect([store.getState().layers.truth.on, store.getState().layers.pred.on]).toEqual([false, false]);
    run(store, 'layer.pred');
    run(store, 'curtain.toggle');
    run(store, 'curtain.toggle');
    expect([store.getState().layers.truth.on, store.getState().layers.pred.on]).toEqual([false, true]);
  });

  it('choosing run B leaves the fixed / broke layer as it is (colour by stays visible), and none turns it off; swap and next run', () => {
    const store = storeWith(2, ['r1', 'r2', 'r3']);
    run(store, 'layer.colourBy', 'truth');
    run(store, 'run.b', 'r3');
    expect(store.getState().runB).toBe('r3');
    expect(store.getState().layers.compare.on).toBe(false);
    expect(store.getState().layers.disagree).toMatchObject({ on: true, mode: 'truth' });
    run(store, 'layer.compare');
    expect(store.getState().layers.compare.on).toBe(true);
    run(store, 'run.swap');
    expect([store.getState().runA, store.getState().runB]).toEqual(['r3', 'r1']);
    run(store, 'run.b', null);
    expect(store.getState().layers.compare.on).toBe(false);
    run(store, 'run.next');
    expect(store.getState().runA).toBe('r1');
  });

  it('sorts the frame list by a score, worst first, and flips on the same score again', () => {
    const store = storeWith(2);
    run(store, 'frames.sortBy', 'boundaryF');
    expect([store.getState().frameScore, store.getState().sortWorstFirst]).toEqual(['boundaryF', true]);
    run(store, 'frames.sortBy', 'boundaryF');
    expect(store.getState().sortWorstFirst).toBe(false);
    run(store, 'frames.sortBy', 'meanIoU');
    expect([store.getState().frameScore, store.getState().sortWorstFirst]).toEqual(['meanIoU', true]);
  });

  it('refuses a void id that is not whole or names a class, and takes a good one', () => {
    const store = storeWith(2, ['r1'], true);
    expect(run(store, 'settings.set', { ignore: 7 })).toBe('void id 7 is the id of class "crane" in classes.json; choose another void id');
    expect(run(store, 'settings.set', { ignore: 2.5 })).toBe('the void id is a whole number');
    expect(store.getState().settings.ignore).toBe(255);
    expect(run(store, 'settings.set', { ignore: 254 })).toBeNull();
    expect(store.getState().settings.ignore).toBe(254);
  });

  it('a verdict is given to an item and cleared by the same verdict again, from a button or from its key on the selection', () => {
    const store = storeWith(3);
    const q = item(1);
    const key = suspectKey(suspectRefOf(q));
    run(store, 'verdict.toggle', { item: q, verdict: 'model-error' });
    expect(store.getState().reviewVerdicts[key]?.verdict).toBe('model-error');
    run(store, 'verdict.toggle', { item: q, verdict: 'model-error' });
    expect(store.getState().reviewVerdicts[key]).toBeUndefined();
    run(store, 'verdict.toggle', { item: q, verdict: 'unsure' });
    run(store, 'verdict.toggle', { item: q, verdict: 'label-mistake' });
    expect(store.getState().reviewVerdicts[key]?.verdict).toBe('label-mistake');
  });

  it('a flag draft of a queue item carries the region and its verdict as the reason; the form saves and closes', () => {
    const store = storeWith(3);
    const q = item(2);
    run(store, 'flag.item', q);
    expect(store.getState().flagDraft).toMatchObject({ frame: 'f2', kind: 'region', bbox: [4, 6, 20, 30], reason: 'label-mistake', run: 'r1', region: { truthClass: 7, predictedClass: 0 } });
    run(store, 'verdict.toggle', { item: q, verdict: 'unsure' });
    run(store, 'flag.item', q);
    expect(store.getState().flagDraft?.reason).toBe('unsure');
    const saved = run(store, 'flag.save', { reason: 'unsure', note: 'edge of the crane' });
    expect(saved?.ok).toBe(true);
    expect(store.getState().flagDraft).toBeNull();
    expect(store.getState().reviewFlags.map((f) => [f.frame, f.reason, f.note])).toEqual([['f2', 'unsure', 'edge of the crane']]);
    expect(enabled(store, 'review.undo')).toBe(true);
  });

  it('a drawn box under 2 px a side flags nothing and stops drawing; a real one opens the form', () => {
    const store = storeWith(1);
    store.setState({ shown: { name: 'f0', width: 40, height: 20 } as never, shownIndex: 0 });
    run(store, 'flag.box');
    expect(store.getState().boxDrawing).toBe(true);
    run(store, 'flag.boxDrawn', [3, 3, 4, 9]);
    expect(store.getState().boxDrawing).toBe(false);
    expect(store.getState().flagDraft).toBeNull();
    run(store, 'flag.boxDrawn', [3, 3, 9, 9]);
    expect(store.getState().flagDraft).toMatchObject({ frame: 'f0', kind: 'rect', bbox: [3, 3, 9, 9], run: 'r1' });
  });
});

describe('command registry: Esc and keys for every action', () => {
  it('closes the topmost open thing per Esc press: flag form, help, dialog, box drawing, one class only, message', () => {
    const store = storeWith(3, ['r1']);
    store.getState().datasetErrorSet('bad folder');
    run(store, 'layer.only', 7);
    run(store, 'flag.box');
    store.getState().dialogSet('export');
    run(store, 'help');
    run(store, 'flag.frame');
    const open = () => {
      const s = store.getState();
      return [s.flagDraft !== null, s.helpOpen, s.dialog !== null, s.boxDrawing, s.layers.solo.on, s.datasetError !== null];
    };
    expect(open()).toEqual([true, true, true, true, true, true]);
    const esc = commandForChord(APP_COMMAND_LIST, 'Escape')!;
    for (let closed = 1; closed <= 6; closed++) {
      expect(esc.enabled({ store, viewer: null })).toBe(true);
      esc.run({ store, viewer: null });
      expect(open()).toEqual(Array.from({ length: 6 }, (_, i) => i >= closed));
    }
    expect(esc.enabled({ store, viewer: null })).toBe(false);
  });

  it('gives every action without a payload a key, so the help lists it; the cycling keys step through their lists', () => {
    // Commands the UI runs as answers to a form or a button next to an open thing, not as actions of their own.
    const answers = new Set(['flag.cancel', 'dialog.close', 'play.step', 'dataset.openDemo', 'dataset.dismissError', 'results.rescore', 'results.dismissError']);
    const unkeyed = APP_COMMAND_LIST.filter((c) => c.keys.length === 0 && c.run.length < 2 && !answers.has(c.id)).map((c) => c.id);
    expect(unkeyed).toEqual([]);
    const store = storeWith(3, ['r1', 'r2', 'r3']);
    const modes = [1, 2, 3].map(() => (run(store, 'layer.colourByNext'), store.getState().layers.disagree.mode));
    expect(modes).toEqual(['truth', 'pred', 'kind']);
    const bs = [1, 2, 3].map(() => (run(store, 'run.nextB'), store.getState().runB));
    expect(bs).toEqual(['r2', 'r3', null]);
    const lists = [1, 2, 3].map(() => (run(store, 'pane.nextList'), store.getState().leftTab));
    expect(lists).toEqual(['queue', 'flags', 'frames']);
    const sorts = [1, 2, 3].map(() => (run(store, 'queue.sortNext'), store.getState().queueView.sort));
    expect(sorts).toEqual(['score-high', 'score-low', 'rank']);
    run(store, 'queue.verdictNext');
    expect(store.getState().queueView.verdict).toBe('unjudged');
  });
});
