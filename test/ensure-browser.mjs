// Browser tests drive Debian's chromium through playwright-core (no browser download is reachable
// here). This brings the package when it is missing and we are root, or says exactly what to install.
import { existsSync } from 'node:fs';
import { spawnSync } from 'node:child_process';

const CHROMIUM = process.env.HAIRLINE_CHROMIUM ?? '/usr/bin/chromium';

function run(cmd, args) {
  const r = spawnSync(cmd, args, { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
  return r.status === 0;
}

if (!existsSync(CHROMIUM)) {
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  if (!isRoot) {
    console.error(
      `Browser tests need Chromium at ${CHROMIUM}. Install it with:\n  sudo apt-get install -y chromium\n` +
        '(or set HAIRLINE_CHROMIUM to a Chromium binary).',
    );
    process.exit(1);
  }
  console.error(`Chromium not found at ${CHROMIUM}; installing Debian's chromium package…`);
  if (!run('apt-get', ['install', '-y', '-qq', 'chromium'])) {
    run('apt-get', ['update', '-qq']);
    if (!run('apt-get', ['install', '-y', '-qq', 'chromium'])) {
      console.error('Could not install chromium. Run as root: apt-get update && apt-get install -y chromium');
      process.exit(1);
    }
  }
  if (!existsSync(CHROMIUM)) {
    console.error(`chromium installed but ${CHROMIUM} is missing; set HAIRLINE_CHROMIUM to its path.`);
    process.exit(1);
  }
}
