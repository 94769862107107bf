import { useEffect, useRef } from 'react';
import type { DatasetSource } from '../data/sources/source.ts';
import { markCss } from './markCss.ts';

const W = 112;
const H = 72;

/**
 * A small picture of the photo around `bbox` (with some context) and the box outlined, cropped and
 * scaled by the browser's own decoder (createImageBitmap), so only the thumbnail is kept.
 */
export function Thumb({ source, image, bbox }: { source: DatasetSource; image: string | null; bbox: readonly number[] }) {
  const canvas = useRef<HTMLCanvasElement>(null);
  useEffect(() => {
    let cancelled = false;
    const c = canvas.current;
    if (!c || !image) return;
    void (async () => {
      try {
        const blob = await source.read('images', image);
        const [x0, y0, x1, y1] = bbox;
        const bw = x1 - x0, bh = y1 - y0;
        // Context: the box fills about half the thumbnail, at least 24 px around it.
        const side = Math.max(bw * 2, bh * 2 * (W / H), 48);
        const sw = Math.round(side), sh = Math.round(side * (H / W));
        const sx = Math.round(x0 + bw / 2 - sw / 2), sy = Math.round(y0 + bh / 2 - sh / 2);
        const bmp = await createImageBitmap(blob, sx, sy, sw, sh, { resizeWidth: W, resizeHeight: H, resizeQuality: 'medium' });
        if (cancelled) return bmp.close();
        const ctx = c.getContext('2d')!;
        ctx.fillStyle = '#1d2126';
        ctx.fillRect(0, 0, W, H);
        ctx.drawImage(bmp, 0, 0);
        bmp.close();
        const k = W / sw;
        ctx.strokeStyle = markCss('highlight');
        ctx.lineWidth = 1.5;
        ctx.strokeRect((x0 - sx) * k - 1, (y0 - sy) * k - 1, bw * k + 2, bh * k + 2);
      } catch {
        /* no thumbnail: the list still works */
      }
    })();
    return () => {
      cancelled = true;
    };
  }, [source, image, bbox]);
  return <canvas ref={canvas} width={W} height={H} className="thumb" />;
}
