// A served dataset of many small frames and its results folder, written by the real results writer:
// a few distinct frames are drawn, scored for real in this process (frameJobScore) and hard-linked
// under many names; each frame's result is the score of its distinct frame under its own name, so the
// tables are exactly what `npm run score -- --dataset DIR --results OUT` writes for the folder, only
// without decoding the same few PNGs thousands of times.
import { linkSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { classTableFromText } from '../../src/core/classTable.ts';
import { frameJobScore, type FrameJobResult } from '../../src/core/frameJob.ts';
import { DEFAULT_SCORE_SETTINGS } from '../../src/core/metrics/settings.ts';
import type { LabelMap } from '../../src/core/labelMap.ts';
import { labelMapToPng } from '../../src/core/png/encode.ts';
import { scoringTableBuild } from '../../src/core/scoringTable.ts';
import { SUSPECT_DEFAULTS } from '../../src/core/suspects/suspectSettings.ts';
import { resultsWriterCreate, type ResultsSummary } from '../../src/cli/resultsWrite.ts';
import { datasetIdOf } from '../../src/cli/scoreResults.ts';
import { harbourPrediction, harbourTruth, HARBOUR_CLASSES } from './harbourScene.ts';

export interface SynthOptions {
  frames: number;
  width?: number;
  height?: number;
  distinct?: number;
  runs?: string[];
  /** Number of classes (the first of the harbour classes; other ids fold onto them by remainder). Default 12. */
  classes?: number;
}

/** Returns the map with class ids folded onto 0..classes−1 (void kept). */
function idsFold(map: LabelMap, classes: number): LabelMap {
  const ids = map.ids.map((v) => (v === 255 ? v : v % classes));
  return { ...map, ids } as LabelMap;
}

/** Frame name of frame i (zero-padded, so name order is index order). */
export const synthName = (i: number) => `f${String(i).padStart(6, '0')}`;

/** Writes the dataset into `root/dataset` and its results folder into `root/results`; returns both paths and the summary. */
export async function resultsSynthesize(root: string, o: SynthOptions): Promise<{ dataset: string; results: string; summary: ResultsSummary }> {
  const { frames, width = 48, height = 24, distinct = 6, runs = ['a'], classes = HARBOUR_CLASSES.length } = o;
  const dataset = join(root, 'dataset'), results = join(root, 'results');
  const classesJson = JSON.stringify({ ignore: 255, classes: HARBOUR_CLASSES.slice(0, classes).map((name, id) => ({ id, name, color: `#${(id * 20 + 16).toString(16)}8040` })) });
  mkdirSync(join(dataset, 'truth'), { recursive: true });
  for (const r of runs) mkdirSync(join(dataset, 'predictions', r), { recursive: true });
  writeFileSync(join(dataset, 'classes.json'), classesJson);
  const parsed = classTableFromText(classesJson, 'classes.json');
  if (!parsed.ok) throw new Error(parsed.error);
  const built = scoringTableBuild(parsed.value, 255);
  if (!built.ok) throw new Error(built.error);
  const table = built.value;
  const scored: FrameJobResult[] = [];
  for (let d = 0; d < distinct; d++) {
    const truth = idsFold(harbourTruth(width, height, 5000 + d), classes);
    const truthPng = labelMapToPng(truth, { kind: 'gray', bitDepth: 8 });
    writeFileSync(join(dataset, 'truth', `src${d}.png`), truthPng);
    const preds = runs.map((run, k) => {
      const png = labelMapToPng(idsFold(harbourPrediction(truth, 6000 + d * 7 + k, 1 + k), classes), { kind: 'gray', bitDepth: 8 });
      writeFileSync(join(dataset, 'predictions', run, `src${d}.png`), png);
      return { run, file: { file: `predictions/${run}/src${d}.png`, bytes: png } };
    });
    scored.push(frameJobScore({ name: `src${d}`, truth: { file: `truth/src${d}.png`, bytes: truthPng }, preds, table, settings: DEFAULT_SCORE_SETTINGS }));
  }
  const names = Array.from({ length: frames }, (_, i) => synthName(i));
  for (let i = 0; i < frames; i++) {
    linkSync(join(dataset, 'truth', `src${i % distinct}.png`), join(dataset, 'truth', `${names[i]}.png`));
    for (const r of runs) linkSync(join(dataset, 'predictions', r, `src${i % distinct}.png`), join(dataset, 'predictions', r, `${names[i]}.png`));
  }
  for (let d = 0; d < distinct; d++) {
    rmSync(join(dataset, 'truth', `src${d}.png`));
    for (const r of runs) rmSync(join(dataset, 'predictions', r, `src${d}.png`));
  }
  const writer = await resultsWriterCreate({
    dir: results, runs, settings: DEFAULT_SCORE_SETTINGS, suspectSettings: SUSPECT_DEFAULTS,
    datasetId: datasetIdOf({ pairing: { runs, frames: names.map((name) => ({ name })) } }), total: frames, from: 0, to: frames, shard: null,
    classTable: { generated: false, ignore: 255, classes: table.classes.map((c) => ({ id: c.id, name: c.name })) }, unpaired: [],
  });
  for (let i = 0; i < frames; i++) writer.add(i, { ...scored[i % distinct], name: names[i] });
  const { summary } = await writer.finish();
  return { dataset, results, summary };
}
