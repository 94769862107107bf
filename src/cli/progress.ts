/** Reports scoring progress on a stream: a redrawn bar on a terminal, plain lines otherwise. */
export interface Progress {
  tick(done: number, failed: number, label: string): void;
  end(done: number, failed: number): void;
}

/** Returns a progress reporter for `total` frames writing to `stream` (stderr by default). */
export function progressCreate(total: number, stream: NodeJS.WriteStream = process.stderr): Progress {
  const start = Date.now();
  const tty = Boolean(stream.isTTY);
  let lastLine = 0;
  const rate = (done: number) => {
    const s = (Date.now() - start) / 1000;
    return s > 0 ? done / s : 0;
  };
  return {
    tick(done, failed, label) {
      const now = Date.now();
      if (tty) {
        if (now - lastLine < 50 && done < total) return;
        lastLine = now;
        const width = Math.max(10, Math.min(40, (stream.columns ?? 80) - 50));
        const filled = total ? Math.round((done / total) * width) : width;
        const bar = '█'.repeat(filled) + '░'.repeat(width - filled);
        const fail = failed ? `, ${failed} failed` : '';
        stream.write(`\r${bar} ${done}/${total} frames${fail} · ${rate(done).toFixed(1)}/s  ${label.slice(0, 20).padEnd(20)}`);
      } else {
        if (now - lastLine < 1000 && done < total) return;
        lastLine = now;
        stream.write(`scored ${done}/${total} frames${failed ? ` (${failed} failed)` : ''}, ${rate(done).toFixed(1)} frames/s\n`);
      }
    },
    end(done, failed) {
      const s = ((Date.now() - start) / 1000).toFixed(1);
      if (tty) stream.write('\r\x1b[K');
      stream.write(`scored ${done} of ${total} frames in ${s} s${failed ? `; ${failed} failed` : ''}\n`);
    },
  };
}
