import type { StateCreator } from 'zustand/vanilla';
import { fail, ok, type Result } from '../core/result.ts';
import type { Flag, FlagBox, FlagKind, FlagRegion } from '../core/review/flag.ts';
import { flagFromJson } from '../core/review/flagCheck.ts';
import { flagsFileParse, flagsFileText, type FlagsFileDataset } from '../core/review/flagsFile.ts';
import { flagsImportPlan, type FlagsImportReport } from '../core/review/flagsImport.ts';
import { reviewRecordKey, reviewRecordsMerge, type ReviewRecord } from '../core/review/reviewRecord.ts';
import { suspectKey, verdictFromJson, type SuspectRef, type SuspectVerdict, type SuspectVerdictKind } from '../core/review/verdict.ts';
import { reviewChangeInvert, reviewStackPush, reviewStamp, type ReviewChange, type ReviewUndoOutcome } from './reviewHistory.ts';
import type { AppState } from './store.ts';

/** What a new flag needs; id and times are filled in. */
export interface FlagInput {
  frame: string;
  kind: FlagKind;
  bbox: FlagBox | null;
  reason: string;
  note?: string;
  run?: string | null;
  region?: FlagRegion;
}

/** The parts of a flag an edit may change. */
export type FlagPatch = Partial<Pick<Flag, 'reason' | 'note' | 'bbox' | 'run'>>;

/** 'off' without a dataset; 'loading' while saved flags are read; 'ready' once they are in. */
export type ReviewStatus = 'off' | 'loading' | 'ready';

export interface ReviewSlice {
  /** Fingerprint of the dataset the flags belong to (`dataset.key`), or null. */
  reviewDatasetKey: string | null;
  /** Every record by key, tombstones included (they keep a delete from being undone by an older write). */
  reviewRecords: Readonly<Record<string, ReviewRecord>>;
  /** Live flags, oldest first (replaced, never mutated, on every change). */
  reviewFlags: readonly Flag[];
  /** Live verdicts by suspect key. */
  reviewVerdicts: Readonly<Record<string, SuspectVerdict>>;
  reviewStatus: ReviewStatus;
  /** Why saved flags could not be read or written, or null; what is on screen is kept either way. */
  reviewError: string | null;
  /** This tab's writer id (ties between equal edit times go to the larger id, the same in every tab). */
  reviewWriter: string;
  reviewUndoStack: readonly ReviewChange[];
  reviewRedoStack: readonly ReviewChange[];
  /** Adds a flag; returns it, or why the input is unusable. */
  flagAdd(input: FlagInput): Result<Flag>;
  /** Changes reason, note, box or run of a flag; returns the new version. */
  flagEdit(id: string, patch: FlagPatch): Result<Flag>;
  /** Deletes flags (one undo step); returns how many existed. */
  flagsDelete(ids: readonly string[]): number;
  /** Sets (or with null clears) the verdict on a suspect item; returns the verdict, or why the item is unusable. */
  verdictSet(ref: SuspectRef, verdict: SuspectVerdictKind | null): Result<SuspectVerdict | null>;
  reviewUndo(): ReviewUndoOutcome | null;
  reviewRedo(): ReviewUndoOutcome | null;
  /** Merges a flags file (last write wins per id; one undo step); returns what was added, updated, skipped. */
  flagsImport(text: string, file: string): Result<FlagsImportReport>;
  /** Returns the live flags and verdicts as a flags file (JSON text). */
  flagsExportText(): string;
  /** Starts over for another dataset (flags cleared until the keeper loads the saved ones). */
  reviewOpen(datasetKey: string | null): void;
  /** Merges records from storage or another tab (not undoable); returns those that won. */
  reviewMerge(records: readonly ReviewRecord[]): ReviewRecord[];
  reviewStatusSet(status: ReviewStatus, error?: string | null): void;
}

function idNew(): string {
  const c = globalThis.crypto;
  if (c && typeof c.randomUUID === 'function') return c.randomUUID();
  return `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 12)}`;
}

/** Returns the live flags (oldest first, then by id) and verdicts of a record table. */
function reviewLive(records: Readonly<Record<string, ReviewRecord>>): Pick<ReviewSlice, 'reviewFlags' | 'reviewVerdicts'> {
  const flags: Flag[] = [];
  const verdicts: Record<string, SuspectVerdict> = {};
  for (const r of Object.values(records)) {
    if (r.type === 'flag' && r.flag) flags.push(r.flag);
    else if (r.type === 'verdict' && r.verdict) verdicts[r.id] = r.verdict;
  }
  flags.sort((a, b) => a.createdAt - b.createdAt || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  return { reviewFlags: flags, reviewVerdicts: verdicts };
}

/** Returns the dataset description a flags file carries, from the open dataset (or the key alone). */
export function reviewFileDataset(s: AppState): FlagsFileDataset | null {
  if (s.dataset) return { key: s.dataset.key, title: s.dataset.title, frames: s.dataset.pairing.frames.length };
  return s.reviewDatasetKey ? { key: s.reviewDatasetKey, title: '', frames: 0 } : null;
}

/** Returns the review slice: flags and verdicts with undo/redo; persistence is attached by reviewKeep. */
export const reviewSlice: StateCreator<AppState, [], [], ReviewSlice> = (set, get) => {
  /** Applies locally made records as one undoable change. */
  const commit = (label: string, records: ReviewRecord[]) => {
    if (records.length === 0) return;
    const s = get();
    const next = { ...s.reviewRecords };
    const steps: ReviewChange['steps'] = [];
    for (const r of records) {
      const key = reviewRecordKey(r);
      steps.push({ key, before: next[key], after: r });
      next[key] = r;
    }
    set({ reviewRecords: next, ...reviewLive(next), reviewUndoStack: reviewStackPush(s.reviewUndoStack, { label, steps }), reviewRedoStack: [] });
  };
  const frameKnown = (frame: string) => {
    const frames = get().dataset?.pairing.frames;
    return !frames || frames.some((f) => f.name === frame);
  };
  const step = (from: 'reviewUndoStack' | 'reviewRedoStack'): ReviewUndoOutcome | null => {
    const s = get();
    const stack = s[from];
    if (stack.length === 0) return null;
    const { records, inverse, outcome } = reviewChangeInvert(stack[stack.length - 1], s.reviewRecords, s.reviewWriter, Date.now());
    const next = { ...s.reviewRecords };
    for (const r of records) next[reviewRecordKey(r)] = r;
    const to = from === 'reviewUndoStack' ? 'reviewRedoStack' : 'reviewUndoStack';
    set({
      reviewRecords: next, ...reviewLive(next),
      [from]: stack.slice(0, -1),
      [to]: inverse.steps.length ? reviewStackPush(s[to], inverse) : s[to],
    });
    return outcome;
  };

  return {
    reviewDatasetKey: null,
    reviewRecords: {},
    reviewFlags: [],
    reviewVerdicts: {},
    reviewStatus: 'off',
    reviewError: null,
    reviewWriter: idNew(),
    reviewUndoStack: [],
    reviewRedoStack: [],

    flagAdd: (input) => {
      if (!frameKnown(input.frame)) return fail('', `frame ${JSON.stringify(input.frame)} is not in this dataset`);
      const s = get();
      const id = idNew();
      const t = reviewStamp(s.reviewRecords, `flag/${id}`, Date.now());
      const checked = flagFromJson(
        { id, frame: input.frame, kind: input.kind, bbox: input.bbox, reason: input.reason, note: input.note ?? '', run: input.run ?? null, createdAt: t, updatedAt: t, region: input.region },
        'flag',
      );
      if (!checked.ok) return checked;
      commit('add flag', [{ type: 'flag', id, updatedAt: t, writer: s.reviewWriter, flag: checked.value }]);
      return checked;
    },

    flagEdit: (id, patch) => {
      const s = get();
      const key = reviewRecordKey({ type: 'flag', id });
      const have = s.reviewRecords[key];
      if (!have || have.type !== 'flag' || !have.flag) return fail('', `no flag with id ${JSON.stringify(id)}`);
      const t = reviewStamp(s.reviewRecords, key, Date.now());
      const checked = flagFromJson({ ...have.flag, ...patch, updatedAt: t }, 'flag');
      if (!checked.ok) return checked;
      commit('edit flag', [{ type: 'flag', id, updatedAt: t, writer: s.reviewWriter, flag: checked.value }]);
      return checked;
    },

    flagsDelete: (ids) => {
      const s = get();
      const now = Date.now();
      const records: ReviewRecord[] = [];
      for (const id of new Set(ids)) {
        const key = reviewRecordKey({ type: 'flag', id });
        const have = s.reviewRecords[key];
        if (!have || have.type !== 'flag' || !have.flag) continue;
        records.push({ type: 'flag', id, updatedAt: reviewStamp(s.reviewRecords, key, now), writer: s.reviewWriter, flag: null });
      }
      commit(records.length === 1 ? 'delete flag' : `delete ${records.length} flags`, records);
      return records.length;
    },

    verdictSet: (ref, verdict) => {
      const s = get();
      const id = suspectKey(ref);
      const key = reviewRecordKey({ type: 'verdict', id });
      const have = s.reviewRecords[key];
      const current = have?.type === 'verdict' ? have.verdict : null;
      if ((current?.verdict ?? null) === verdict) return ok(current);
      const t = reviewStamp(s.reviewRecords, key, Date.now());
      let value: SuspectVerdict | null = null;
      if (verdict !== null) {
        const checked = verdictFromJson({ ...ref, verdict, updatedAt: t }, 'verdict');
        if (!checked.ok) return checked;
        value = checked.value;
      }
      commit(verdict === null ? 'clear verdict' : 'set verdict', [{ type: 'verdict', id, updatedAt: t, writer: s.reviewWriter, verdict: value }]);
      return ok(value);
    },

    reviewUndo: () => step('reviewUndoStack'),
    reviewRedo: () => step('reviewRedoStack'),

    flagsImport: (text, file) => {
      const parsed = flagsFileParse(text, file);
      if (!parsed.ok) return parsed;
      const s = get();
      const frames = s.dataset ? new Set(s.dataset.pairing.frames.map((f) => f.name)) : null;
      const plan = flagsImportPlan(s.reviewRecords, parsed.value, { file, writer: s.reviewWriter, dataset: reviewFileDataset(s), frameNames: frames });
      commit(`import ${file}`, plan.records);
      return ok(plan.report);
    },

    flagsExportText: () => {
      const s = get();
      const dataset = reviewFileDataset(s) ?? { key: '', title: '', frames: 0 };
      return flagsFileText(dataset, s.reviewFlags, Object.values(s.reviewVerdicts), Date.now());
    },

    reviewOpen: (datasetKey) =>
      set({
        reviewDatasetKey: datasetKey, reviewRecords: {}, reviewFlags: [], reviewVerdicts: {},
        reviewStatus: datasetKey === null ? 'off' : 'loading', reviewError: null, reviewUndoStack: [], reviewRedoStack: [],
      }),

    reviewMerge: (incoming) => {
      const s = get();
      const { records, won } = reviewRecordsMerge(s.reviewRecords, incoming);
      if (won.length) set({ reviewRecords: records, ...reviewLive(records) });
      return won;
    },

    reviewStatusSet: (reviewStatus, error) => set(error === undefined ? { reviewStatus } : { reviewStatus, reviewError: error }),
  };
};

/** Returns the verdict on a suspect item, or null. */
export function verdictOf(s: Pick<ReviewSlice, 'reviewVerdicts'>, ref: SuspectRef): SuspectVerdict | null {
  return s.reviewVerdicts[suspectKey(ref)] ?? null;
}
