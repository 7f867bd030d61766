import { afterEach, describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { hostname, tmpdir } from 'node:os';
import { join } from 'node:path';
import { createHash } from 'node:crypto';
import { currentOwner, DataDirInUseError, judgeOwner, lockDataDir, OWNER_FILE, type OwnerInfo } from '~/lib/server/data-dir-lock';

const dirs: string[] = [];
const freshDir = () => {
  const d = mkdtempSync(join(tmpdir(), 'cw-lock-'));
  dirs.push(d);
  return d;
};
afterEach(() => {
  for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true });
});

const me: OwnerInfo = {
  pid: 4242,
  host: 'barn-1',
  bootId: 'boot-a',
  pidNamespace: 'pid:[1]',
  startTicks: '100',
  since: '2026-01-01T00:00:00Z',
  nonce: 'me',
};
const dead = () => false;
const alive = () => true;

const writeOwner = (dir: string, owner: unknown) =>
  writeFileSync(join(dir, OWNER_FILE), typeof owner === 'string' ? owner : JSON.stringify(owner));
const ownerIn = (dir: string) => JSON.parse(readFileSync(join(dir, OWNER_FILE), 'utf8')) as OwnerInfo;

describe('judgeOwner: only a provably gone owner is stale', () => {
  it('another host name could be alive, even when that process id is free here', () => {
    expect(judgeOwner({ pid: 77, host: 'barn-2' }, me, dead).stale).toBe(false);
  });
  it('the same host with a process id that is not running is stale', () => {
    expect(judgeOwner({ pid: 77, host: 'barn-1' }, me, dead).stale).toBe(true);
    // an owner file from before boot ids were recorded is judged by host and process alone
    expect(judgeOwner({ pid: 77, host: 'barn-1', since: 'x' }, me, dead).stale).toBe(true);
  });
  it('the same host with a running process id is alive', () => {
    const v = judgeOwner({ pid: 77, host: 'barn-1', bootId: 'boot-a' }, me, alive);
    expect(v.stale).toBe(false);
  });
  it('another boot id (another machine of the same name, or a reboot) could be alive', () => {
    expect(judgeOwner({ pid: 77, host: 'barn-1', bootId: 'boot-b' }, me, dead).stale).toBe(false);
  });
  it('another process namespace (a container with the same host name) could be alive', () => {
    expect(judgeOwner({ pid: 77, host: 'barn-1', bootId: 'boot-a', pidNamespace: 'pid:[2]' }, me, dead).stale).toBe(false);
  });
  it('a running process id whose start time differs is a reused id: stale', () => {
    const v = judgeOwner({ pid: 77, host: 'barn-1', bootId: 'boot-a', startTicks: '50' }, me, alive, () => '900');
    expect(v.stale).toBe(true);
    const same = judgeOwner({ pid: 77, host: 'barn-1', bootId: 'boot-a', startTicks: '50' }, me, alive, () => '50');
    expect(same).toMatchObject({ stale: false, provablyRunning: true });
  });
  it('an unreadable or incomplete owner could be alive', () => {
    expect(judgeOwner(null, me, dead).stale).toBe(false);
    expect(judgeOwner({ host: 'barn-1' }, me, dead).stale).toBe(false);
    expect(judgeOwner({ pid: -1, host: 'barn-1' }, me, dead).stale).toBe(false);
    expect(judgeOwner({ pid: 77 } as Partial<OwnerInfo>, me, dead).stale).toBe(false);
  });
});

describe('lockDataDir', () => {
  it('creates the owner file whole, with this process, and removes it on release', () => {
    const dir = freshDir();
    const release = lockDataDir(dir, { me: currentOwner() });
    const owner = ownerIn(dir);
    expect(owner.pid).toBe(process.pid);
    expect(owner.host).toBe(hostname());
    expect(readdirSync(dir)).toEqual([OWNER_FILE]); // no temporary files left behind
    release();
    expect(existsSync(join(dir, OWNER_FILE))).toBe(false);
  });

  it('refuses an owner file naming another host, and leaves it in place', () => {
    const dir = freshDir();
    const other = { pid: 999_999, host: `${hostname()}-elsewhere`, since: '2026-01-01T00:00:00Z' };
    writeOwner(dir, other);
    expect(() => lockDataDir(dir, { log: () => {} })).toThrow(DataDirInUseError);
    expect(() => lockDataDir(dir, { log: () => {} })).toThrow(/in use by process 999999 on .*-elsewhere.*another host/);
    expect(ownerIn(dir)).toEqual(other);
  });

  it('refuses an unreadable owner file', () => {
    const dir = freshDir();
    writeOwner(dir, '{"pid": 12');
    expect(() => lockDataDir(dir, { log: () => {} })).toThrow(/cannot be read/);
  });

  it('takes over an owner on this host whose process is gone, and says so', () => {
    const dir = freshDir();
    writeOwner(dir, { pid: 999_999, host: hostname(), since: '2026-01-01T00:00:00Z' });
    const lines: string[] = [];
    const release = lockDataDir(dir, { log: (l) => lines.push(l), isRunning: dead });
    expect(ownerIn(dir).pid).toBe(process.pid);
    expect(lines.join('\n')).toMatch(/took over .* from process 999999/);
    expect(readdirSync(dir)).toEqual([OWNER_FILE]); // the takeover file is gone again
    release();
  });

  it('refuses a running owner on this host', () => {
    const dir = freshDir();
    const first = lockDataDir(dir);
    expect(() => lockDataDir(dir, { me: { ...currentOwner(), pid: 1, nonce: 'second' }, isRunning: alive })).toThrow(
      /in use by process \d+/,
    );
    first();
  });

  it('--force-unlock takes over another host’s owner and logs it', () => {
    const dir = freshDir();
    writeOwner(dir, { pid: 4, host: 'far-away-shed', since: '2026-01-01T00:00:00Z' });
    const lines: string[] = [];
    const release = lockDataDir(dir, { force: true, log: (l) => lines.push(l) });
    expect(ownerIn(dir).pid).toBe(process.pid);
    expect(lines.join('\n')).toMatch(/FORCED takeover .* from process 4 on far-away-shed/);
    release();
  });

  it('--force-unlock never takes a directory from a process provably running here', () => {
    const dir = freshDir();
    const first = lockDataDir(dir); // this very process, start time recorded
    // the owner's process id runs with the start time recorded: provably the running owner
    expect(() => lockDataDir(dir, { force: true, me: { ...currentOwner(), pid: 1, nonce: 'x' }, isRunning: alive })).toThrow(
      DataDirInUseError,
    );
    first();
  });

  it('a release never removes an owner file another server wrote after a forced takeover', () => {
    const dir = freshDir();
    const first = lockDataDir(dir);
    const second = lockDataDir(dir, {
      force: true,
      me: { ...currentOwner(), pid: 1, startTicks: null, nonce: 'other' },
      isRunning: dead,
      log: () => {},
    });
    first();
    expect(ownerIn(dir).nonce).toBe('other');
    second();
    expect(existsSync(join(dir, OWNER_FILE))).toBe(false);
  });

  it('of two takers of one stale owner, only the one holding the takeover file replaces it', () => {
    const dir = freshDir();
    const stale = JSON.stringify({ pid: 999_999, host: hostname(), since: 'then' });
    writeOwner(dir, stale);
    // Another taker is mid-way: it holds the takeover file for this stale owner.
    writeFileSync(join(dir, `${OWNER_FILE}.takeover-${createHash('sha256').update(stale).digest('hex').slice(0, 16)}`), '{}');
    expect(() => lockDataDir(dir, { isRunning: dead, log: () => {} })).toThrow(/taking over/);
    expect(readFileSync(join(dir, OWNER_FILE), 'utf8')).toBe(stale);
  });
});
