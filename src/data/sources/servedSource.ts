import { listingFromPaths, type DatasetSource } from './source.ts';

/** Returns the dataset folder that `npm start -- DIR` serves, or null when it serves none. */
export async function servedSourceOpen(base = '/dataset/'): Promise<DatasetSource | null> {
  const res = await fetch(`${base}index.json`, { cache: 'no-store' });
  if (res.status === 404) return null;
  if (!res.ok) throw new Error(`the server could not list the dataset folder (HTTP ${res.status})`);
  const index = (await res.json()) as { title: string | null; files: string[] | null };
  if (index.files === null || index.title === null) return null;
  const { listing, classesPath } = listingFromPaths(index.files);
  const url = (path: string) => `${base}file/${path.split('/').map(encodeURIComponent).join('/')}`;
  let classesText: string | null = null;
  if (classesPath) {
    const r = await fetch(url(classesPath), { cache: 'no-store' });
    if (!r.ok) throw new Error(`classes.json: could not be read (HTTP ${r.status})`);
    classesText = await r.text();
  }
  return {
    kind: 'served',
    title: index.title,
    listing,
    classesText,
    async read(folder, path) {
      const r = await fetch(url(`${folder}/${path}`));
      if (!r.ok) throw new Error(`${folder}/${path}: could not be read (HTTP ${r.status})`);
      return r.blob();
    },
  };
}
