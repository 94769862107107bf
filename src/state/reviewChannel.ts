/** A note to other tabs: these records of this dataset were just written by `writer`. */
export interface ReviewChannelMessage {
  datasetKey: string;
  keys: string[];
  writer: string;
}

/** How tabs tell each other about writes (BroadcastChannel in the browser and in Node). */
export interface ReviewChannel {
  post(message: ReviewChannelMessage): void;
  listen(handler: (message: ReviewChannelMessage) => void): void;
  close(): void;
}

function isMessage(v: unknown): v is ReviewChannelMessage {
  if (typeof v !== 'object' || v === null) return false;
  const m = v as Record<string, unknown>;
  return typeof m.datasetKey === 'string' && typeof m.writer === 'string' && Array.isArray(m.keys) && m.keys.every((k) => typeof k === 'string');
}

/** Returns a channel over BroadcastChannel `name`, or null where BroadcastChannel is missing (then other tabs see writes on reload). */
export function reviewChannelOpen(name = 'hairline-review'): ReviewChannel | null {
  if (typeof BroadcastChannel === 'undefined') return null;
  const bc = new BroadcastChannel(name);
  return {
    post: (m) => bc.postMessage(m),
    listen: (h) => bc.addEventListener('message', (e) => {
      if (isMessage((e as MessageEvent).data)) h((e as MessageEvent).data);
    }),
    close: () => bc.close(),
  };
}
