import { unzipSync } from 'fflate';
import { afterEach, describe, expect, it } from 'vitest';
import { threadPortCreate } from '../../src/cli/threadPort.ts';
import type { TileManifest } from '../../src/core/export/tileRows.ts';
import { labelMapFromPng } from '../../src/core/png/decodeLabel.ts';
import { labelMapToPng } from '../../src/core/png/encode.ts';
import type { DatasetSource } from '../../src/data/sources/source.ts';
import { datasetFromSource, datasetInstall } from '../../src/state/datasetLoad.ts';
import { reviewTilesExport } from '../../src/state/reviewExport.ts';
import { appStoreCreate } from '../../src/state/store.ts';
import { workerPoolCreate } from '../../src/workers/pool.ts';
import type { ViewPool } from '../../src/workers/scorePool.ts';
import type { ViewJobs } from '../../src/workers/viewJobs.ts';

const ENTRY = new URL('./fixtures/viewWorkerThread.ts', import.meta.url);
let pool: ViewPool | null = null;
afterEach(() => pool?.destroy());

const W = 40, H = 24;
const truthIds = Uint8Array.from({ length: W * H }, (_, i) => ((i % W) >> 3) + (((i / W) | 0) % 2));
const predIds = Uint8Array.from(truthIds, (v, i) => (i % 7 === 0 ? 3 : v));
const PALETTE = Uint8Array.from({ length: 16 * 3 }, (_, i) => (i * 53) & 255);

describe('reviewTilesExport: the app\'s export over the view workers', () => {
  it('cuts the store\'s flags from frames decoded in the view pool, ids exact, runs in dataset order', async () => {
    pool = workerPoolCreate<ViewJobs>(() => threadPortCreate(ENTRY), 1);
    const truth = new Blob([labelMapToPng({ width: W, height: H, ids: truthIds }, { kind: 'gray', bitDepth: 8 }) as BlobPart]);
    const pred = new Blob([labelMapToPng({ width: W, height: H, ids: predIds }, { kind: 'palette', colors: PALETTE }) as BlobPart]);
    const source: DatasetSource = {
      kind: 'folder', title: 'small', classesText: null,
      listing: { images: [], truth: ['f1.png', 'f2.png'], predictions: { r1: ['f1.png', 'f2.png'] } },
      read: async (folder) => (folder === 'truth' ? truth : pred),
    };
    const store = appStoreCreate();
    datasetInstall(store, datasetFromSource(source));
    store.getState().flagAdd({ frame: 'f2', kind: 'rect', bbox: [5, 3, 17, 11], reason: 'unsure', run: 'r1' });
    store.getState().flagAdd({ frame: 'f1', kind: 'frame', bbox: null, reason: 'label-mistake' });
    const parts: Uint8Array[] = [];
    const r = await reviewTilesExport(store, pool, { flags: store.getState().reviewFlags, mode: { kind: 'crop', padding: 2 }, sink: (c) => void parts.push(c.slice()) });
    if (!r.ok) throw new Error(r.error);
    const files = unzipSync(new Uint8Array(Buffer.concat(parts)));
    const m = JSON.parse(new TextDecoder().decode(files['manifest.json'])) as TileManifest;
    expect(m.dataset).toEqual({ key: store.getState().dataset!.key, title: 'small', frames: 2 });
    expect(m.tiles.map((t) => [t.frame, t.box])).toEqual([['f1', [0, 0, W, H]], ['f2', [3, 1, 19, 13]]]);
    const t = m.tiles[1];
    const got = labelMapFromPng(files[t.preds[0].file], { file: 'x' });
    if (!got.ok) throw new Error(got.error);
    expect(got.value.encoding.kind).toBe('palette');
    const want: number[] = [];
    for (let y = 1; y < 13; y++) for (let x = 3; x < 19; x++) want.push(predIds[y * W + x]);
    expect(Array.from(got.value.ids)).toEqual(want);
    expect(t.notes).toEqual(['no photo for this frame']);
  });
});
