#!/usr/bin/env node
// Browser tests drive Debian's Chromium; never a browser downloaded by a test tool.
import { existsSync } from 'node:fs';
import { spawnSync } from 'node:child_process';

export const CHROMIUM = process.env.CAGEWRIGHT_CHROMIUM ?? '/usr/bin/chromium';

export function ensureChromium() {
  if (existsSync(CHROMIUM)) return true;
  const root = typeof process.getuid === 'function' && process.getuid() === 0;
  if (!root) {
    console.error(
      `Chromium is missing at ${CHROMIUM}. Install Debian's package, then run the tests again:\n` +
        '  sudo apt-get update && sudo apt-get install -y chromium',
    );
    return false;
  }
  console.log('Installing Debian chromium for the browser tests…');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  for (const args of [
    ['update', '-qq'],
    ['install', '-y', '-qq', 'chromium'],
  ]) {
    const r = spawnSync('apt-get', args, { stdio: 'inherit', env });
    if (r.status !== 0) {
      console.error(`apt-get ${args.join(' ')} failed (exit ${r.status}).`);
      return false;
    }
  }
  return existsSync(CHROMIUM);
}

if (import.meta.url === `file://${process.argv[1]}`) process.exit(ensureChromium() ? 0 : 1);
