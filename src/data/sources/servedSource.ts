import type { DatasetSource } from './source.ts';
import { layoutPath, sourceFieldsOf, sourceLayoutOpen } from './sourceLayout.ts';

/** Returns the dataset folder that `npm start -- DIR` serves, or null when it serves none. */
export async function servedSourceOpen(base = '/dataset/'): Promise<DatasetSource | null> {
  const res = await fetch(`${base}index.json`, { cache: 'no-store' });
  if (res.status === 404) return null;
  if (!res.ok) throw new Error(`the server could not list the dataset folder (HTTP ${res.status})`);
  const index = (await res.json()) as { title: string | null; files: string[] | null };
  if (index.files === null || index.title === null) return null;
  const url = (path: string) => `${base}file/${path.split('/').map(encodeURIComponent).join('/')}`;
  const layout = await sourceLayoutOpen(index.files, async (path) => {
    const r = await fetch(url(path), { cache: 'no-store' });
    if (!r.ok) throw new Error(`${path}: could not be read (HTTP ${r.status})`);
    return r.text();
  }, async (path) => {
    const r = await fetch(url(path));
    if (!r.ok) throw new Error(`${path}: could not be read (HTTP ${r.status})`);
    return new Uint8Array(await r.arrayBuffer());
  });
  return {
    kind: 'served',
    title: index.title,
    ...sourceFieldsOf(layout),
    async read(folder, path) {
      const at = layoutPath(layout, folder, path);
      const r = await fetch(url(at));
      if (!r.ok) throw new Error(`${at}: could not be read (HTTP ${r.status})`);
      return r.blob();
    },
  };
}
