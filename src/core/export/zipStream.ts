import { strToU8, Zip, ZipDeflate, ZipPassThrough } from 'fflate';

/** Receives the ZIP's bytes in order; `final` is true on the last chunk. May return a promise to slow the writer down (back-pressure). */
export type ZipSink = (chunk: Uint8Array, final: boolean) => void | Promise<void>;

/** A ZIP written entry by entry to a sink, so only the entry being added is held in memory. */
export interface ZipStream {
  /** Adds an entry stored as is (PNGs are compressed already); resolves when the sink has taken it. */
  addStored(name: string, bytes: Uint8Array): Promise<void>;
  /** Adds a text entry, deflated. */
  addText(name: string, text: string): Promise<void>;
  /** Writes the central directory; resolves after the final chunk. */
  end(): Promise<void>;
  /** Stops writing (no final chunk is sent). */
  abort(): void;
  /** Bytes handed to the sink so far. */
  written(): number;
}

/** Returns a streaming ZIP (fflate's Zip) writing to `sink`. */
export function zipStreamCreate(sink: ZipSink, mtime: Date = new Date()): ZipStream {
  let error: Error | null = null;
  let written = 0;
  let pending: Promise<void>[] = [];
  const zip = new Zip((err, chunk, final) => {
    if (err) {
      error ??= err;
      return;
    }
    written += chunk.length;
    try {
      const p = sink(chunk, final);
      if (p) pending.push(p.catch((e: unknown) => void (error ??= e instanceof Error ? e : new Error(String(e)))));
    } catch (e) {
      error ??= e instanceof Error ? e : new Error(String(e));
    }
  });
  const settle = async () => {
    const now = pending;
    pending = [];
    await Promise.all(now);
    if (error) throw error;
  };
  const add = (entry: ZipPassThrough | ZipDeflate, bytes: Uint8Array) => {
    if (error) return Promise.reject(error);
    entry.mtime = mtime;
    zip.add(entry);
    entry.push(bytes, true);
    return settle();
  };
  return {
    addStored: (name, bytes) => add(new ZipPassThrough(name), bytes),
    addText: (name, text) => add(new ZipDeflate(name, { level: 6 }), strToU8(text)),
    async end() {
      if (error) throw error;
      zip.end();
      await settle();
    },
    abort: () => zip.terminate(),
    written: () => written,
  };
}
