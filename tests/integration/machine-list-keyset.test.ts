// The machines list a page at a time by keyset cursors: Next reads from the current page's last
// row, Previous from its first, so a deep page costs what the first one does. Walking the whole
// list forward and back must visit every machine once, in the list's order, ties included.
// Other suites add machines to the same store meanwhile, so the checks are about the machines
// made here (all of one farm) and about repeats, never about exact totals.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn } from './client';
import { machineByNickname, newMachineLike, uniq, type MachineItem } from './fleet-helpers';

let olive: Client;
let northQuarter: MachineItem;
const made: string[] = [];
/** Seven machines with one name (ties broken by id) and five with names of their own. */
const tieName = uniq('Keyset tie');
const ownNames = Array.from({ length: 5 }, (_, i) => `${uniq('Keyset')} ${i}`);

beforeAll(async () => {
  olive = await signedIn('operator');
  northQuarter = await machineByNickname(olive, 'North Quarter');
  for (const nickname of [...Array(7).fill(tieName), ...ownNames]) {
    made.push(await newMachineLike(olive, northQuarter, nickname, 'KS'));
  }
}, 60_000);

afterAll(async () => {
  for (const id of made) expect((await olive.delete(`/api/machines/${id}`)).status).toBe(200);
}, 60_000);

type Page = {
  items: { id: string; nickname: string; updatedAt: string }[];
  next: string | null;
  prev: string | null;
  page: number;
  total: number;
};

/** Every page from the first, following `next`; stops at an empty page or after `limit` pages. */
async function walkForward(filter: string, pageSize: number, limit = 200): Promise<Page[]> {
  const pages: Page[] = [];
  let res = await olive.get(`/api/machines?${filter}&pageSize=${pageSize}&page=1`);
  for (let n = 1; n <= limit; n++) {
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const page = res.body as Page;
    if (page.items.length === 0) break;
    pages.push(page);
    if (page.items.length < pageSize) break;
    res = await olive.get(`/api/machines?${filter}&pageSize=${pageSize}&page=${n + 1}&after=${encodeURIComponent(page.next!)}`);
  }
  return pages;
}

const ids = (pages: Page[]) => pages.flatMap((p) => p.items.map((m) => m.id));
const mine = (list: string[]) => list.filter((id) => made.includes(id));

describe('machines list by keyset cursors', () => {
  it('walking Next visits every machine once, in the same order as paging by number, ties included', async () => {
    const filter = `sort=nickname&orgId=${northQuarter.orgId}`;
    const walked = ids(await walkForward(filter, 3));
    expect(new Set(walked).size).toBe(walked.length);
    expect(mine(walked).sort()).toEqual([...made].sort());
    // The same list read by page number (one big page): the machines made here in the same order.
    const byNumber = (await olive.get(`/api/machines?${filter}&pageSize=100`)).body.items.map((m: { id: string }) => m.id);
    expect(mine(walked)).toEqual(mine(byNumber));
    // Names ascending, ties by id ascending.
    const tied = mine(walked).slice(0, 7);
    expect(tied).toEqual([...tied].sort());
  });

  it('Previous from any page gives back the page before it', async () => {
    const filter = `sort=nickname&orgId=${northQuarter.orgId}`;
    const pages = await walkForward(filter, 3);
    expect(pages.length).toBeGreaterThan(3);
    for (let i = 1; i < pages.length; i++) {
      const back = await olive.get(`/api/machines?${filter}&pageSize=3&page=${i}&before=${encodeURIComponent(pages[i]!.prev!)}`);
      expect(back.status).toBe(200);
      expect(back.body.items.map((m: { id: string }) => m.id)).toEqual(pages[i - 1]!.items.map((m) => m.id));
    }
  });

  it('descending by last change: the newest first, each machine once', async () => {
    const pages = await walkForward(`sort=-updatedAt&orgId=${northQuarter.orgId}`, 4);
    const walked = ids(pages);
    expect(new Set(walked).size).toBe(walked.length);
    expect(mine(walked).sort()).toEqual([...made].sort());
    const times = pages.flatMap((p) => p.items.map((m) => Date.parse(m.updatedAt)));
    for (let i = 1; i < times.length; i++) expect(times[i]!).toBeLessThanOrEqual(times[i - 1]!);
  });

  it('a page sorted by farm or found by a search is read by number and carries no cursor', async () => {
    const res = await olive.get(`/api/machines?q=${encodeURIComponent(tieName)}&pageSize=3`);
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(7);
    expect(res.body.next).toBeNull();
    const second = await olive.get(`/api/machines?q=${encodeURIComponent(tieName)}&pageSize=3&page=2`);
    expect(mine(second.body.items.map((m: { id: string }) => m.id))).toHaveLength(3);
  });

  it('a cursor that is not one, or belongs to another sort, is a 400 naming it', async () => {
    const first = await olive.get(`/api/machines?sort=nickname&pageSize=2`);
    const cursor = encodeURIComponent(first.body.next);
    const cases: [string, string][] = [
      ['sort=nickname&after=not-a-cursor', 'after'],
      [`sort=nickname&before=${Buffer.from('["nickname","x","nope"]').toString('base64url')}`, 'before'],
      [`sort=-updatedAt&after=${cursor}`, 'after'],
      [`sort=nickname&after=${cursor}&before=${cursor}`, 'before'],
      [`sort=nickname&after=${'a'.repeat(500)}`, 'after'],
    ];
    for (const [query, field] of cases) {
      const res = await olive.get(`/api/machines?${query}`);
      expect(res.status, query).toBe(400);
      expect(res.body.error.field, query).toBe(field);
    }
  });
});
