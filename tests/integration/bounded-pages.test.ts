// Pages that stay bounded as data grows: a layout with 300 versions shows its history a page at
// a time (keyset on the version number) with working older/newer links; compare and share pages
// list no versions; the copy-to-machine list is searched, never the whole fleet.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn } from './client';
import { machineByNickname, newLayout, newMachineLike, uniq, type MachineItem } from './fleet-helpers';

const VERSIONS = 300;
const PAGE = 50;
/** Bytes a page may take whatever the number of versions (the quality bar allows 100 KB). */
const PAGE_BOUND = 100 * 1024;

let olive: Client;
let northQuarter: MachineItem;
let layoutId: string;
let base: string;
const prefix = uniq('Copy target');
const made: string[] = [];

async function page(path: string) {
  const res = await olive.fetch(path);
  const html = await res.text();
  return { status: res.status, html, bytes: Buffer.byteLength(html) };
}

/** The version numbers in the history table, top to bottom. */
const rowsOf = (html: string) => [...html.matchAll(/<tr[^>]*data-version="(\d+)"/g)].map((m) => Number(m[1]));
const linkOf = (html: string, rel: 'next' | 'prev') => {
  const m = html.match(new RegExp(`<a[^>]*rel="${rel}"[^>]*href="([^"]+)"|<a[^>]*href="([^"]+)"[^>]*rel="${rel}"`));
  return m ? (m[1] ?? m[2])!.replace(/&amp;/g, '&') : null;
};

beforeAll(async () => {
  olive = await signedIn('operator');
  northQuarter = await machineByNickname(olive, 'North Quarter');
  const { layout, version } = await newLayout(olive, northQuarter.id, uniq('Long history'));
  layoutId = layout.id;
  base = `/machines/${northQuarter.id}/layouts/${layoutId}`;
  for (let v = 1; v < VERSIONS; v++) {
    const res = await olive.put(`/api/layouts/${layoutId}`, {
      baseVersion: v,
      body: { ...version.body, rotorRpm: 500 + v },
      note: `save ${v + 1}`,
    });
    if (res.status !== 201) throw new Error(`save ${v + 1}: ${res.status} ${JSON.stringify(res.body)}`);
  }
  // More machines of the same family than the copy list shows at once.
  for (let i = 0; i < 24; i++) {
    made.push(await newMachineLike(olive, northQuarter, `${prefix} ${String(i).padStart(2, '0')}`, 'BP'));
  }
}, 180_000);

// Other suites share the store and read the first page of Olive's machines.
afterAll(async () => {
  for (const id of made) if (id) expect((await olive.delete(`/api/machines/${id}`)).status).toBe(200);
}, 60_000);

describe('history page of a layout with 300 versions', () => {
  it('shows the newest 50, stays under a fixed size, and links to the older ones', async () => {
    const first = await page(`${base}/history`);
    expect(first.status).toBe(200);
    expect(first.bytes).toBeLessThan(PAGE_BOUND);
    expect(rowsOf(first.html)).toEqual(Array.from({ length: PAGE }, (_, i) => VERSIONS - i));
    expect(linkOf(first.html, 'prev')).toBeNull();
    expect(linkOf(first.html, 'next')).toBe(`${base}/history?before=${VERSIONS - PAGE + 1}`);
    // No control lists every version.
    expect((first.html.match(/<option/g) ?? []).length).toBeLessThanOrEqual(25);
  });

  it('the older link shows the next 50, and its newer link leads back', async () => {
    const second = await page(`${base}/history?before=${VERSIONS - PAGE + 1}`);
    expect(second.status).toBe(200);
    expect(rowsOf(second.html)).toEqual(Array.from({ length: PAGE }, (_, i) => VERSIONS - PAGE - i));
    expect(second.html).toContain('save 250');
    expect(linkOf(second.html, 'prev')).toBe(`${base}/history`);
    const third = await page(linkOf(second.html, 'next')!);
    expect(rowsOf(third.html)[0]).toBe(VERSIONS - 2 * PAGE);
  });

  it('walking the older links visits every version once and ends at version 1', async () => {
    const seen: number[] = [];
    let next: string | null = `${base}/history`;
    let pages = 0;
    while (next && pages < 20) {
      const p = await page(next);
      expect(p.bytes).toBeLessThan(PAGE_BOUND);
      seen.push(...rowsOf(p.html));
      next = linkOf(p.html, 'next');
      pages++;
    }
    expect(pages).toBe(VERSIONS / PAGE);
    expect(seen).toEqual(Array.from({ length: VERSIONS }, (_, i) => VERSIONS - i));
  });

  it('an odd cursor is taken as given, and a bad one shows the newest page', async () => {
    expect(rowsOf((await page(`${base}/history?before=7`)).html)).toEqual([6, 5, 4, 3, 2, 1]);
    for (const bad of ['0', '-3', 'abc', '99999999999', '1e3']) {
      const p = await page(`${base}/history?before=${bad}`);
      expect(p.status, bad).toBe(200);
      expect(rowsOf(p.html)[0], bad).toBe(VERSIONS);
    }
  });

  it("a row's Compare with current link compares that version with the current one", async () => {
    const history = (await page(`${base}/history`)).html;
    const link = /href="([^"]*\/compare\?a=(\d+)[^"]*)"[^>]*>Compare with current/.exec(history);
    expect(link).not.toBeNull();
    const [, href, a] = link!;
    // One parameter: b is the current version (an "&" in an attribute costs a failed URL parse per row when rendered).
    expect(href).not.toContain('&');
    const compared = await page(href!.replaceAll('&amp;', '&'));
    expect(compared.status).toBe(200);
    expect(compared.html).toContain(`What changed from version ${a} to version ${VERSIONS}`);
    // Both given, or b alone not a number: as before (b given wins; a bad query compares the last two).
    expect((await page(`${base}/compare?a=2&b=3`)).html).toContain('What changed from version 2 to version 3');
    expect((await page(`${base}/compare?a=x`)).html).toContain(`What changed from version ${VERSIONS - 1} to version ${VERSIONS}`);
  });

  it('compare and share pages carry no list of versions and stay small', async () => {
    for (const path of [`${base}/compare`, `${base}/compare?a=1&b=${VERSIONS}`, `${base}/share`, `${base}/share?version=120`]) {
      const p = await page(path);
      expect(p.status, path).toBe(200);
      expect(p.bytes, path).toBeLessThan(PAGE_BOUND);
      expect((p.html.match(/<option/g) ?? []).length, path).toBeLessThan(20);
    }
    const share = await page(`${base}/share?version=120`);
    expect(share.html).toMatch(/name="version"[^>]*value="120"|value="120"[^>]*name="version"/);
  });
});

describe('restore and mark installed from the history table', () => {
  let layout: string;
  let path: string;
  let machineId: string;
  beforeAll(async () => {
    // A machine of its own: marking a version installed changes what the machine has fitted.
    machineId = await newMachineLike(olive, northQuarter, uniq('Restore table'), 'RT');
    made.push(machineId);
    const started = await newLayout(olive, machineId, uniq('Restore from table'));
    layout = started.layout.id;
    path = `/machines/${machineId}/layouts/${layout}/history`;
    const saved = await olive.put(`/api/layouts/${layout}`, {
      baseVersion: 1,
      body: { ...started.version.body, rotorRpm: 777 },
      note: 'faster',
    });
    expect(saved.status).toBe(201);
  });
  const post = (fields: Record<string, string>) =>
    olive.fetch(path, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams(fields).toString(),
    });
  const versionsOf = async () => (await olive.get(`/api/layouts/${layout}/versions`)).body.versions as { version: number }[];

  it('one form serves every row: each button posts its own version', async () => {
    const html = (await page(path)).html;
    expect(html.match(/<form[^>]*id="version-actions"/g)).toHaveLength(1);
    expect(html).toMatch(/<button[^>]*form="version-actions"[^>]*name="restore"[^>]*value="1"/);
    expect(html).toMatch(/<button[^>]*form="version-actions"[^>]*name="install"[^>]*value="2"/);
  });

  it('Restore writes the old content as a new version on top, and a bad version writes nothing', async () => {
    const bad = await post({ restore: 'x', baseVersion: '2' });
    expect(bad.status).toBe(400);
    expect(await bad.text()).toContain('version: choose a version');
    expect(await versionsOf()).toHaveLength(2);
    const res = await post({ restore: '1', baseVersion: '2' });
    expect(res.status).toBe(303);
    expect(res.headers.get('location')).toContain('restored=1&as=3');
    const now = await olive.get(`/api/layouts/${layout}`);
    expect(now.body.layout.currentVersion).toBe(3);
    expect(now.body.current.body.rotorRpm).not.toBe(777);
    // A stale base (someone saved since the page was drawn) is refused, nothing written.
    const stale = await post({ restore: '2', baseVersion: '2' });
    expect(stale.status).toBe(409);
    expect(await versionsOf()).toHaveLength(3);
  });

  it('Mark installed records the version as installed in the machine', async () => {
    const res = await post({ install: '2' });
    expect(res.status).toBe(200);
    expect(await res.text()).toContain('Version 2 is now recorded as installed');
    const installed = await olive.get(`/api/machines/${machineId}/installed`);
    expect(installed.status).toBe(200);
    // Version 2 is the one saved at 777 rpm.
    expect(installed.body.installed.layout.rotorRpm).toBe(777);
  });
});

describe('versions API a page at a time', () => {
  it('pages by a keyset cursor (before) as well as by page number, with the total', async () => {
    const first = await olive.get(`/api/layouts/${layoutId}/versions?pageSize=${PAGE}`);
    expect(first.status).toBe(200);
    expect(first.body.total).toBe(VERSIONS);
    expect(first.body.versions.map((v: any) => v.version)).toEqual(Array.from({ length: PAGE }, (_, i) => VERSIONS - i));
    expect(first.body.nextBefore).toBe(VERSIONS - PAGE + 1);
    const byCursor = await olive.get(`/api/layouts/${layoutId}/versions?pageSize=${PAGE}&before=${first.body.nextBefore}`);
    const byPage = await olive.get(`/api/layouts/${layoutId}/versions?pageSize=${PAGE}&page=2`);
    expect(byCursor.body.versions.map((v: any) => v.version)).toEqual(byPage.body.versions.map((v: any) => v.version));
    expect(byCursor.body.versions[0].version).toBe(VERSIONS - PAGE);
    const last = await olive.get(`/api/layouts/${layoutId}/versions?pageSize=${PAGE}&before=${PAGE + 1}`);
    expect(last.body.versions.map((v: any) => v.version).at(-1)).toBe(1);
    expect(last.body.nextBefore).toBeNull();
  });

  it('a bad cursor is a 400 naming it', async () => {
    for (const bad of ['0', 'x', '-1']) {
      const res = await olive.get(`/api/layouts/${layoutId}/versions?before=${bad}`);
      expect(res.status, bad).toBe(400);
      expect(JSON.stringify(res.body), bad).toContain('before');
    }
  });
});

describe('copy to another machine: searched, never the whole fleet', () => {
  const optionsOf = (html: string) => {
    const form = html.match(/data-testid="copy-form"[\s\S]*?<\/form>/)?.[0] ?? '';
    return [...form.matchAll(/<option[^>]*>([^<]*)</g)].map((m) => m[1]!);
  };

  it('shows at most 20 machines and says how many more there are', async () => {
    const p = await page(`${base}/history?to=${encodeURIComponent(prefix)}`);
    const options = optionsOf(p.html);
    expect(options).toHaveLength(20);
    expect(options.every((o) => o.startsWith(prefix))).toBe(true);
    expect(p.html).toMatch(/data-testid="copy-more"[^>]*>Showing 20 of 24 machines/);
  });

  it('a search finds the one machine by name, and the copy goes there', async () => {
    const wanted = `${prefix} 23`;
    const p = await page(`${base}/history?to=${encodeURIComponent(wanted)}`);
    const options = optionsOf(p.html);
    expect(options).toHaveLength(1);
    expect(options[0]).toContain(wanted);
    expect(p.html).not.toContain('data-testid="copy-more"');
    const machineId = p.html.match(/data-testid="copy-form"[\s\S]*?<option value="([0-9a-f-]{36})"/)![1]!;
    const res = await olive.fetch(`${base}/history?to=${encodeURIComponent(wanted)}`, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ form: 'copy', version: '42', machineId, name: '' }).toString(),
    });
    const html = await res.text();
    expect(res.status).toBe(200);
    expect(html).toMatch(/data-testid="copy-result"[^>]*>\s*Copied to [^<]*23/);
    const there = await olive.get(`/api/machines/${machineId}/layouts`);
    expect(there.body.layouts).toHaveLength(1);
    const copy = await olive.get(`/api/layouts/${there.body.layouts[0].id}`);
    expect(copy.body.current.body.rotorRpm).toBe(500 + 41);
  });

  it('a search that finds nothing says so', async () => {
    const p = await page(`${base}/history?to=${encodeURIComponent('no such machine ' + prefix)}`);
    expect(optionsOf(p.html)).toHaveLength(0);
    expect(p.html).toContain('matches “no such machine');
  });
});

describe('a machine with many layouts', () => {
  let machineId: string;
  const LAYOUTS = 55;

  beforeAll(async () => {
    machineId = await newMachineLike(olive, northQuarter, uniq('Many layouts'), 'ML');
    made.push(machineId);
    for (let i = 0; i < LAYOUTS; i++) {
      const l = await olive.post(`/api/machines/${machineId}/layouts`, { name: `Plan ${String(i).padStart(2, '0')}`, crop: 'wheat' });
      if (l.status !== 201) throw new Error(`layout ${i}: ${l.status}`);
    }
  }, 180_000);

  const layoutRows = (html: string) =>
    [
      ...(html.match(/data-testid="layouts-table"[\s\S]*?<\/table>/)?.[0] ?? '').matchAll(
        /class="font-semibold" href="[^"]+">(Plan \d+)</g,
      ),
    ].map((m) => m[1]!);

  it('the machine page shows the 50 most recent with a link to the older ones, and the activity still names them', async () => {
    const first = await page(`/machines/${machineId}`);
    expect(first.status).toBe(200);
    expect(first.bytes).toBeLessThan(PAGE_BOUND);
    const rows = layoutRows(first.html);
    expect(rows).toHaveLength(50);
    expect(rows[0]).toBe('Plan 54');
    expect(first.html).toMatch(/Layouts 1–50 of 55/);
    expect(linkOf(first.html, 'next')).toBe(`/machines/${machineId}?layouts=2`);
    expect(first.html).toMatch(/data-testid="activity"[\s\S]*started “Plan 54”/);

    const second = await page(`/machines/${machineId}?layouts=2`);
    expect(layoutRows(second.html)).toEqual(['Plan 04', 'Plan 03', 'Plan 02', 'Plan 01', 'Plan 00']);
    expect(linkOf(second.html, 'prev')).toBe(`/machines/${machineId}`);
    expect(linkOf(second.html, 'next')).toBeNull();
  });

  it('the layouts API pages too, with the total, and names a bad page size', async () => {
    const all = await olive.get(`/api/machines/${machineId}/layouts`);
    expect(all.status).toBe(200);
    expect(all.body.layouts).toHaveLength(50);
    expect(all.body.total).toBe(LAYOUTS);
    const last = await olive.get(`/api/machines/${machineId}/layouts?pageSize=20&page=3`);
    expect(last.body.layouts.map((l: any) => l.name)).toEqual([
      'Plan 14',
      'Plan 13',
      'Plan 12',
      'Plan 11',
      'Plan 10',
      'Plan 09',
      'Plan 08',
      'Plan 07',
      'Plan 06',
      'Plan 05',
      'Plan 04',
      'Plan 03',
      'Plan 02',
      'Plan 01',
      'Plan 00',
    ]);
    for (const bad of ['pageSize=0', 'pageSize=500', 'page=0', 'page=x']) {
      const res = await olive.get(`/api/machines/${machineId}/layouts?${bad}`);
      expect(res.status, bad).toBe(400);
      expect(res.body.error.field, bad).toBe(bad.split('=')[0]);
    }
  });
});

describe('the crop-change planner: machines searched, never cut at a fixed count', () => {
  const extra = uniq('Planner pick');
  beforeAll(async () => {
    for (let i = 0; i < 30; i++) {
      made.push(await newMachineLike(olive, northQuarter, `${extra} ${String(i).padStart(2, '0')}`, 'PP'));
    }
  }, 120_000);

  const machineOptions = (html: string) => {
    const form = html.match(/data-testid="plan-form"[\s\S]*?<\/select>/)?.[0] ?? '';
    return [...form.matchAll(/<option value="([0-9a-f-]{36})"[^>]*>([^<]*)</g)].map((m) => m[2]!);
  };

  it('offers a search and one page of machines when there are more than fit', async () => {
    const total = (await olive.get('/api/machines?pageSize=1')).body.total as number;
    expect(total).toBeGreaterThan(50);
    const p = await page('/planner');
    expect(p.status).toBe(200);
    expect(machineOptions(p.html)).toHaveLength(50);
    expect(p.html).toContain(`Showing 50 of ${total}`);
    const found = await page(`/planner?find=${encodeURIComponent(extra + ' 29')}`);
    expect(machineOptions(found.html)).toEqual([`${extra} 29 · ${'Tamarack M4'}`]);
  });

  it('keeps the machine being planned choosable when the search leaves it out', async () => {
    const nq = await page(`/planner?machine=${northQuarter.id}&crop=canola&find=${encodeURIComponent(extra)}`);
    expect(nq.status).toBe(200);
    const options = machineOptions(nq.html);
    expect(options[0]).toContain('North Quarter');
    expect(nq.html).toMatch(new RegExp(`<option value="${northQuarter.id}"[^>]*selected`));
  });
});
