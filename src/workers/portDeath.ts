/** The death side of a worker port: handlers told once why the worker stopped, and not after terminate. */
export interface PortDeath {
  /** Tells every handler `reason`, the first time only. */
  die(reason: string): void;
  onDeath(handler: (reason: string) => void): void;
  /** Marks the worker as stopped on purpose: its exit is not reported. */
  silence(): void;
}

/** Returns the death bookkeeping shared by the browser and Node worker ports. */
export function portDeathCreate(): PortDeath {
  let dead = false;
  const handlers: ((reason: string) => void)[] = [];
  return {
    die(reason) {
      if (dead) return;
      dead = true;
      for (const h of handlers) h(reason);
    },
    onDeath: (h) => void handlers.push(h),
    silence() {
      dead = true;
    },
  };
}
