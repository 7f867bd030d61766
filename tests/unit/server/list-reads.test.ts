// The fleet's list reads and the layout save at scale, against a real embedded store with the real
// migrations: what each answers (checked against the same rule worked out here in plain code),
// how many statements each sends to the store, and, from EXPLAIN ANALYZE, how many machine rows
// the default list page reads. The data is invented; no figure here comes from a published source.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const dir = mkdtempSync(join(tmpdir(), 'cagewright-list-reads-'));
process.env.CAGEWRIGHT_DATA_DIR = dir;
process.env.CAGEWRIGHT_SEED = 'off';

const { store, getDb } = await import('~/lib/server/db');
const { copyTargets, listMachines, machineListQuerySchema } = await import('~/lib/server/services/machines');
const { layoutOnMachineWithVersions, listVersions, listLayoutsForMachine, saveVersion, versionListQuerySchema } =
  await import('~/lib/server/services/layouts');
const { families, catalogParts } = await import('~/db/schema');
const { demoCatalog, demoFamilies } = await import('~/lib/domain/demo-catalog');
const { starterLayout } = await import('~/lib/domain/starter');
const { HttpError } = await import('~/lib/server/http');
import type { Actor } from '~/lib/server/access';
import type { Layout } from '~/lib/domain/schemas';

const MACHINES = 2000;
const family = demoFamilies[0]!;
const otherFamily = demoFamilies[1]!;
const body: Layout = starterLayout(
  family,
  'wheat',
  demoCatalog.filter((p) => p.fitGroup === family.fitGroup),
);

let dealer: Actor;
let outsider: Actor;
let farmIds: string[];
let outsiderMachine: string;
/** A layout with 120 versions on a machine the dealer sees. */
let longLayout: { id: string; machineId: string };

/** The embedded store's own client under Drizzle. */
const rawClient = async () =>
  ((await getDb()) as unknown as { $client: { query: (text: string, params?: unknown[]) => Promise<{ rows: unknown[] }> } }).$client;

/** Every statement sent to the store while `run` runs. */
async function statementsOf<T>(run: () => Promise<T>): Promise<{ result: T; statements: string[]; params: unknown[][] }> {
  const client = (await rawClient()) as unknown as Record<'query' | 'exec', (...args: unknown[]) => Promise<unknown>>;
  const original = { query: client.query, exec: client.exec };
  const statements: string[] = [];
  const params: unknown[][] = [];
  for (const name of ['query', 'exec'] as const) {
    client[name] = (...args: unknown[]) => {
      statements.push(String(args[0]));
      params.push(Array.isArray(args[1]) ? args[1] : []);
      return original[name]!(...args);
    };
  }
  try {
    return { result: await run(), statements, params };
  } finally {
    client.query = original.query;
    client.exec = original.exec;
  }
}

const rows = async <T>(q: ReturnType<typeof sql>) => (await (await getDb()).execute(q)).rows as T[];

const actor = (id: string, orgs: string[], role: Actor['role'] = 'technician'): Actor => ({
  id,
  email: `${id.slice(0, 8)}@test.example`,
  name: 'Tester',
  role,
  unitSystem: 'metric',
  memberOrgIds: [orgs[0]!],
  visibleOrgIds: orgs,
  homeOrgId: orgs[0]!,
  homeOrgKind: 'dealer',
});

beforeAll(async () => {
  const db = await getDb();
  for (const f of [family, otherFamily]) await db.insert(families).values({ id: f.id, name: f.name, spec: f });
  await db
    .insert(catalogParts)
    .values(
      demoCatalog
        .filter((p) => p.fitGroup === family.fitGroup)
        .map((p) => ({ partNumber: p.partNumber, familyId: family.id, kind: p.kind, spec: p })),
    );
  const [d] = await rows<{ id: string }>(sql`insert into organisations (name, kind) values ('Wrenfield Dealer', 'dealer') returning id`);
  const farms = await rows<{ id: string }>(sql`
    insert into organisations (name, kind, dealer_id)
    values ('Ashgrove Acres', 'farm', ${d!.id}), ('Brackenridge Farm', 'farm', ${d!.id}), ('Outland Holdings', 'farm', null)
    returning id`);
  farmIds = farms.slice(0, 2).map((f) => f.id);
  const [u] = await rows<{ id: string }>(
    sql`insert into users (email, name, password_hash) values ('t@test.example', 'Tess Tester', 'x') returning id`,
  );
  const [o] = await rows<{ id: string }>(
    sql`insert into users (email, name, password_hash) values ('o@test.example', 'Otto Outland', 'x') returning id`,
  );
  dealer = actor(u!.id, [d!.id, ...farmIds]);
  outsider = actor(o!.id, [farms[2]!.id], 'operator');
  // Machines spread over both farms and two families, changed at different times (some at the
  // same instant, so the id breaks ties), with names, serials and notes to search.
  await db.execute(sql`
    insert into machines (org_id, family_id, drum, vane_control, serial, nickname, notes, updated_at)
    select case when g % 3 = 0 then ${farmIds[1]}::uuid else ${farmIds[0]}::uuid end,
           case when g % 5 = 0 then ${otherFamily.id} else ${family.id} end,
           'full', 'fixed', 'SN-' || lpad(g::text, 5, '0'), 'Unit ' || g,
           case when g % 97 = 0 then 'Bearing noise by the Gate' else '' end,
           timestamptz '2026-01-01' + (g % 700) * interval '1 hour'
    from generate_series(1, ${MACHINES}) g`);
  await db.execute(sql`
    insert into machines (org_id, family_id, drum, vane_control, serial, nickname)
    values (${farms[2]!.id}, ${family.id}, 'full', 'fixed', 'OUT-1', 'Unit Outland')`);
  [{ id: outsiderMachine }] = await rows<{ id: string }>(sql`select id from machines where serial = 'OUT-1'`);
  const [m] = await rows<{ id: string }>(sql`select id from machines where serial = 'SN-00001'`);
  const [l] = await rows<{ id: string }>(sql`
    insert into layouts (machine_id, org_id, name, current_version, created_by)
    values (${m!.id}, ${farmIds[0]}, 'long plan', 120, ${u!.id}) returning id`);
  await db.execute(sql`
    insert into layout_versions (layout_id, version, body, note, created_by)
    select ${l!.id}, v, ${JSON.stringify(body)}::jsonb, 'step ' || v, ${u!.id} from generate_series(1, 120) v`);
  longLayout = { id: l!.id, machineId: m!.id };
  // Three more layouts on that machine, for its list.
  await db.execute(sql`
    insert into layouts (machine_id, org_id, name, current_version, updated_at)
    select ${m!.id}, ${farmIds[0]}, 'spare ' || g, 1, now() - g * interval '1 day' from generate_series(1, 3) g`);
  await db.execute(sql`
    insert into layout_versions (layout_id, version, body)
    select id, 1, ${JSON.stringify(body)}::jsonb from layouts where name like 'spare %'`);
  await db.execute(sql`analyze`);
}, 120_000);

afterAll(async () => {
  await (await store()).close();
  rmSync(dir, { recursive: true, force: true });
});

interface Plain {
  id: string;
  nickname: string;
  serial: string;
  notes: string;
  family_name: string;
  org_name: string;
  org_id: string;
  updated_at: Date;
}
/** Every machine the dealer sees, read plainly, for the rule worked out in code. */
const everything = () =>
  rows<Plain>(sql`
    select m.id, m.nickname, m.serial, m.notes, f.name as family_name, o.name as org_name, m.org_id, m.updated_at
    from machines m join families f on f.id = m.family_id join organisations o on o.id = m.org_id
    where m.org_id in (${sql.join(
      dealer.visibleOrgIds.map((id) => sql`${id}`),
      sql`, `,
    )})`);

/** Last change first; ties by id, descending too (the ascending order read backwards). */
const byUpdatedDesc = (a: Plain, b: Plain) =>
  new Date(b.updated_at).getTime() - new Date(a.updated_at).getTime() || (a.id < b.id ? 1 : a.id > b.id ? -1 : 0);

describe('the machines list at 2,000 machines', () => {
  it('gives page 20 of the default order (last change first, then id) from the index: two statements, no sort, at most page × size rows read', async () => {
    const query = machineListQuerySchema.parse({ page: '20', pageSize: '50' });
    const { result, statements } = await statementsOf(() => listMachines(dealer, query));
    const expected = (await everything()).sort(byUpdatedDesc);
    expect(result.total).toBe(MACHINES);
    expect(result.items.map((m) => m.id)).toEqual(expected.slice(950, 1000).map((m) => m.id));
    expect(result.items[0]).toMatchObject({ familyName: expect.any(String), orgName: expect.any(String) });
    expect(result.items[0]).not.toHaveProperty('searchText');
    expect(statements).toHaveLength(2);

    // The page's plan: machines read in order from an index, stopping after the page.
    const page = statements.find((s) => !/count\(/i.test(s))!;
    const params = [...dealer.visibleOrgIds, 50, 950];
    const [{ 'QUERY PLAN': plan }] = (await (await rawClient()).query(`explain (analyze, format json) ${page}`, params)).rows as {
      'QUERY PLAN': { Plan: PlanNode }[];
    }[];
    const nodes = flatten(plan[0]!.Plan);
    expect(nodes.some((n) => n['Node Type'] === 'Sort')).toBe(false);
    const machineScans = nodes.filter((n) => n['Relation Name'] === 'machines');
    expect(machineScans).toHaveLength(1);
    expect(machineScans[0]!['Node Type']).toBe('Index Scan');
    expect(machineScans[0]!['Actual Rows']).toBeLessThanOrEqual(1000);
  });

  it('gives page 20 by the Next cursor of page 19 from the index, reading only that page', async () => {
    const p19 = await listMachines(dealer, machineListQuerySchema.parse({ page: '19', pageSize: '50' }));
    const query = machineListQuerySchema.parse({ page: '20', pageSize: '50', after: p19.next });
    const { result, statements, params } = await statementsOf(() => listMachines(dealer, query));
    const expected = (await everything()).sort(byUpdatedDesc);
    expect(result.items.map((m) => m.id)).toEqual(expected.slice(950, 1000).map((m) => m.id));
    // The count is kept from page 19: one statement, the page.
    expect(statements).toHaveLength(1);
    const back = await listMachines(dealer, machineListQuerySchema.parse({ page: '19', pageSize: '50', before: result.prev }));
    expect(back.items.map((m) => m.id)).toEqual(p19.items.map((m) => m.id));

    const [{ 'QUERY PLAN': plan }] = (await (await rawClient()).query(`explain (analyze, format json) ${statements[0]}`, params[0]))
      .rows as { 'QUERY PLAN': { Plan: PlanNode }[] }[];
    const nodes = flatten(plan[0]!.Plan);
    // Whatever sorts, sorts the page's own rows only (the joined 50), never the fleet.
    for (const n of nodes.filter((x) => x['Node Type'] === 'Sort')) expect(n['Actual Rows']).toBeLessThanOrEqual(50);
    const machineScans = nodes.filter((n) => n['Relation Name'] === 'machines');
    expect(machineScans).toHaveLength(1);
    expect(machineScans[0]!['Node Type']).toMatch(/^Index/);
    expect(machineScans[0]!['Actual Rows']).toBeLessThanOrEqual(50);
  });

  it('keeps the total while nothing is written (the page is always read), and counts again after any write', async () => {
    const query = machineListQuerySchema.parse({ page: '3', pageSize: '10' });
    await listMachines(dealer, query);
    const again = await statementsOf(() => listMachines(dealer, query));
    expect(again.statements).toHaveLength(1);
    expect(again.result.total).toBe(MACHINES);
    // Another actor seeing other organisations has a total of their own.
    expect((await listMachines(outsider, query)).total).toBe(1);
    await rows(sql`
      insert into machines (org_id, family_id, drum, vane_control, serial, nickname)
      values (${farmIds[0]}, ${family.id}, 'full', 'fixed', 'SN-NEW', 'Unit New')`);
    const after = await statementsOf(() => listMachines(dealer, query));
    expect(after.statements).toHaveLength(2);
    expect(after.result.total).toBe(MACHINES + 1);
    await rows(sql`delete from machines where serial = 'SN-NEW'`);
    expect((await listMachines(dealer, query)).total).toBe(MACHINES);
  });

  it('pages on through the same order, and sorts by name both ways', async () => {
    const expected = (await everything()).sort(byUpdatedDesc);
    const p1 = await listMachines(dealer, machineListQuerySchema.parse({ page: '1', pageSize: '100' }));
    const p2 = await listMachines(dealer, machineListQuerySchema.parse({ page: '2', pageSize: '100' }));
    expect([...p1.items, ...p2.items].map((m) => m.id)).toEqual(expected.slice(0, 200).map((m) => m.id));
    const byName = await listMachines(dealer, machineListQuerySchema.parse({ sort: 'nickname', pageSize: '100', page: '3' }));
    const names = (await everything()).sort((a, b) => (a.nickname < b.nickname ? -1 : a.nickname > b.nickname ? 1 : a.id < b.id ? -1 : 1));
    expect(byName.items.map((m) => m.id)).toEqual(names.slice(200, 300).map((m) => m.id));
    const byFarm = await listMachines(dealer, machineListQuerySchema.parse({ sort: '-org', pageSize: '10' }));
    expect(byFarm.items.every((m) => m.orgName === 'Brackenridge Farm')).toBe(true);
    expect(byFarm.total).toBe(MACHINES);
  });

  it('searches name, serial, notes, family and farm without regard to case, in one statement with its total', async () => {
    const all = await everything();
    for (const q of ['unit 19', 'sn-0042', 'GATE', otherFamily.name.slice(0, 6).toUpperCase(), 'brackenRIDGE', 'Unit 1999']) {
      const needle = q.toLowerCase();
      const expected = all
        .filter((m) => [m.nickname, m.serial, m.notes, m.family_name, m.org_name].some((t) => t.toLowerCase().includes(needle)))
        .sort((a, b) => (a.nickname < b.nickname ? -1 : a.nickname > b.nickname ? 1 : a.id < b.id ? -1 : 1));
      const { result, statements } = await statementsOf(() =>
        listMachines(dealer, machineListQuerySchema.parse({ q, sort: 'nickname', pageSize: '20' })),
      );
      expect(result.total, q).toBe(expected.length);
      expect(
        result.items.map((m) => m.id),
        q,
      ).toEqual(expected.slice(0, 20).map((m) => m.id));
      expect(statements, q).toHaveLength(1);
    }
  });

  it('takes wildcards literally, never matches across fields, and still counts on a page past the end', async () => {
    expect((await listMachines(dealer, machineListQuerySchema.parse({ q: '%' }))).total).toBe(0);
    expect((await listMachines(dealer, machineListQuerySchema.parse({ q: 'unit_1' }))).total).toBe(0);
    // "Unit 5" then "SN-00005": the stored search value joins them with U+001F, which a search loses.
    expect((await listMachines(dealer, machineListQuerySchema.parse({ q: 'unit 5\u001fsn-00005' }))).total).toBe(0);
    expect((await listMachines(dealer, machineListQuerySchema.parse({ q: '5 sn-0' }))).total).toBe(0);
    const past = await listMachines(dealer, machineListQuerySchema.parse({ q: 'gate', page: '50' }));
    expect(past.items).toEqual([]);
    expect(past.total).toBe(Math.floor(MACHINES / 97));
    // Another farm's machine is never found.
    expect((await listMachines(dealer, machineListQuerySchema.parse({ q: 'outland' }))).total).toBe(0);
    expect((await listMachines(outsider, machineListQuerySchema.parse({ q: 'unit' }))).items.map((m) => m.id)).toEqual([outsiderMachine]);
  });
});

describe('the machines a layout may be copied to', () => {
  it('are the other machines of the family, by name, from machines and farms alone, with their number', async () => {
    const exclude = longLayout.machineId;
    const { result, statements } = await statementsOf(() => copyTargets(dealer, { familyId: family.id, exclude, q: '', limit: 20 }));
    // By hand: every machine of the family the dealer sees, by name then id, without the one itself.
    const all = await rows<{ id: string; nickname: string; serial: string; org: string }>(sql`
      select m.id, m.nickname, m.serial, o.name as org from machines m join organisations o on o.id = m.org_id
      where m.family_id = ${family.id} and m.org_id in (${sql.join(
        dealer.visibleOrgIds.map((o) => sql`${o}::uuid`),
        sql`, `,
      )}) and m.id <> ${exclude}
      order by m.nickname, m.id`);
    expect(result.total).toBe(all.length);
    expect(result.items).toEqual(all.slice(0, 20).map((r) => ({ id: r.id, nickname: r.nickname, serial: r.serial, orgName: r.org })));
    expect(result.items.some((m) => m.id === exclude)).toBe(false);
    for (const q of statements) expect(q).not.toMatch(/"families"/);
    // A text query matches as the machines list's search does, still without the machine itself.
    const found = await copyTargets(dealer, { familyId: family.id, exclude, q: 'unit 1', limit: 5 });
    const listed = await listMachines(
      dealer,
      machineListQuerySchema.parse({ q: 'unit 1', sort: 'nickname', familyId: family.id, pageSize: '100' }),
    );
    const expected = listed.items.filter((m) => m.id !== exclude);
    expect(found.items.map((m) => m.id)).toEqual(expected.slice(0, 5).map((m) => m.id));
    expect(found.total).toBe(listed.total - (listed.items.some((m) => m.id === exclude) ? 1 : 0));
    // Fewer than the limit: all of them, counted without a second statement; another's machines never.
    const few = await statementsOf(() =>
      copyTargets(outsider, { familyId: family.id, exclude: 'b3c1b9c6-0000-4000-8000-000000000000', q: '', limit: 20 }),
    );
    expect(few.result).toEqual({
      items: [{ id: outsiderMachine, nickname: 'Unit Outland', serial: 'OUT-1', orgName: 'Outland Holdings' }],
      total: 1,
    });
    expect(few.statements).toHaveLength(1);
    expect((await copyTargets(outsider, { familyId: family.id, exclude: outsiderMachine, q: '', limit: 20 })).total).toBe(0);
  });
});

describe("a layout's versions and a machine's layouts", () => {
  it('pages versions by number and by cursor, with the total: the layout as the GET reads it, then one small statement', async () => {
    // The first read of the layout asks the store for it (one statement); while nothing is
    // written it is kept, and each page is then one statement on layout_versions alone.
    const { statements: cold } = await statementsOf(() => listVersions(dealer, longLayout.id, versionListQuerySchema.parse({})));
    expect(cold.length).toBeLessThanOrEqual(2);
    const { result: p1, statements } = await statementsOf(() => listVersions(dealer, longLayout.id, versionListQuerySchema.parse({})));
    expect(statements).toHaveLength(1);
    expect(statements[0]).toMatch(/from "layout_versions"/);
    expect(statements[0]).not.toMatch(/"machines"|"families"|"organisations"/);
    expect(p1.total).toBe(120);
    expect(p1.versions.map((v) => v.version)).toEqual(Array.from({ length: 50 }, (_, i) => 120 - i));
    expect(p1.versions[0]).toMatchObject({ note: 'step 120', createdByName: 'Tess Tester' });
    expect(p1.nextBefore).toBe(71);
    expect(p1.layout).toMatchObject({ id: longLayout.id, familyId: family.id, currentVersion: 120 });
    const { result: p3, statements: third } = await statementsOf(() =>
      listVersions(dealer, longLayout.id, versionListQuerySchema.parse({ page: '3' })),
    );
    expect(third).toHaveLength(1);
    expect(p3.versions.map((v) => v.version)).toEqual(Array.from({ length: 20 }, (_, i) => 20 - i));
    expect(p3.nextBefore).toBeNull();
    const { result: cursor, statements: byCursor } = await statementsOf(() =>
      listVersions(dealer, longLayout.id, versionListQuerySchema.parse({ before: '5', pageSize: '3' })),
    );
    expect(byCursor).toHaveLength(1);
    expect(cursor.versions.map((v) => v.version)).toEqual([4, 3, 2]);
    expect(cursor.versions[0]!.createdAt).toBeInstanceOf(Date);
    expect(cursor.nextBefore).toBe(2);
    expect((await listVersions(dealer, longLayout.id, versionListQuerySchema.parse({ before: '999' }))).versions[0]!.version).toBe(120);
    expect(cursor.page).toBeUndefined();
    const beyond = await listVersions(dealer, longLayout.id, versionListQuerySchema.parse({ page: '9' }));
    expect(beyond.versions).toEqual([]);
    expect(beyond.total).toBe(120);
    await expect(listVersions(outsider, longLayout.id, versionListQuerySchema.parse({}))).rejects.toMatchObject({ status: 404 });
  });

  it('gives the history page its layout, family and one page of versions in small statements, with both cursors', async () => {
    const params = { id: longLayout.machineId, layoutId: longLayout.id };
    await layoutOnMachineWithVersions(dealer, params);
    // The layout kept from the read before, the family from the kept catalog (its revision is
    // one single-row read), the page from layout_versions: no join of the six tables to plan.
    const { result: first, statements } = await statementsOf(() => layoutOnMachineWithVersions(dealer, params));
    expect(statements).toHaveLength(2);
    expect(statements.find((q) => /from "layout_versions"/.test(q))).toBeDefined();
    for (const q of statements) expect(q).not.toMatch(/"families"|"organisations"/);
    expect(first!.layout.currentVersion).toBe(120);
    expect(first!.current.version).toBe(120);
    expect(first!.family.id).toBe(family.id);
    expect(first!.page.versions.map((v) => v.version)).toEqual(Array.from({ length: 50 }, (_, i) => 120 - i));
    expect(first!.page.versions[49]).toMatchObject({ note: 'step 71', createdByName: 'Tess Tester', createdAt: expect.any(Date) });
    expect(first!.page).toMatchObject({ olderBefore: 71, newerBefore: undefined });
    const middle = await layoutOnMachineWithVersions(dealer, params, 71);
    expect(middle!.page.versions.map((v) => v.version)).toEqual(Array.from({ length: 50 }, (_, i) => 70 - i));
    expect(middle!.page).toMatchObject({ olderBefore: 21, newerBefore: null });
    const last = await layoutOnMachineWithVersions(dealer, params, 5);
    expect(last!.page).toMatchObject({ olderBefore: null, newerBefore: 55 });
    expect(last!.page.versions.map((v) => v.version)).toEqual([4, 3, 2, 1]);
    // Another machine's id in the path, or a layout not seen: not found.
    expect(await layoutOnMachineWithVersions(dealer, { ...params, id: outsiderMachine })).toBeNull();
    expect(await layoutOnMachineWithVersions(outsider, params)).toBeNull();
  });

  it("lists a machine's layouts, newest change first, in one statement, and counts a page past the end", async () => {
    const { result, statements } = await statementsOf(() => listLayoutsForMachine(dealer, longLayout.machineId, { page: 1, pageSize: 2 }));
    expect(statements).toHaveLength(1);
    expect(result.total).toBe(4);
    expect(result.layouts.map((l) => l.name)).toEqual(['long plan', 'spare 1']);
    expect(result.machine.id).toBe(longLayout.machineId);
    const page2 = await listLayoutsForMachine(dealer, longLayout.machineId, { page: 2, pageSize: 2 });
    expect(page2.layouts.map((l) => l.name)).toEqual(['spare 2', 'spare 3']);
    const past = await listLayoutsForMachine(dealer, longLayout.machineId, { page: 5, pageSize: 2 });
    expect(past).toMatchObject({ layouts: [], total: 4 });
    expect(past.machine.id).toBe(longLayout.machineId);
    const [bare] = await rows<{ id: string }>(sql`select id from machines where serial = 'SN-00002'`);
    expect(await listLayoutsForMachine(dealer, bare!.id)).toMatchObject({ layouts: [], total: 0 });
    await expect(listLayoutsForMachine(dealer, outsiderMachine)).rejects.toMatchObject({ status: 404 });
  });
});

describe('a save', () => {
  const versions = async () =>
    (await rows<{ n: number }>(sql`select count(*)::int as n from layout_versions where layout_id = ${longLayout.id}`))[0]!.n;
  const audits = async () =>
    (await rows<{ n: number }>(sql`select count(*)::int as n from audit_log where entity_id = ${longLayout.id}`))[0]!.n;

  it('is one statement: the version, the move of the current one and the audit row', async () => {
    const changed = { ...body, rotorRpm: body.rotorRpm + 10 };
    const { result, statements } = await statementsOf(() =>
      saveVersion(dealer, longLayout.id, { baseVersion: 120, body: changed, note: 'faster' }),
    );
    expect(statements).toHaveLength(1);
    expect(result).toMatchObject({ version: 121, layoutId: longLayout.id, note: 'faster', createdBy: dealer.id });
    expect(result.body).toEqual(changed);
    const [stored] = await rows<{ body: Layout; current: number }>(sql`
      select v.body, l.current_version as current from layout_versions v join layouts l on l.id = v.layout_id
      where v.layout_id = ${longLayout.id} and v.version = 121`);
    expect(stored).toEqual({ body: changed, current: 121 });
    const [audit] = await rows<{ org_id: string; detail: unknown }>(sql`
      select org_id, detail from audit_log where entity_id = ${longLayout.id} order by id desc limit 1`);
    expect(audit).toEqual({ org_id: farmIds[0], detail: { version: 121, from: 120 } });
  });

  it('writes nothing and says why: 404 for a layout not seen, 400 for another family, 409 for a stale base', async () => {
    const [v0, a0] = [await versions(), await audits()];
    const refusal = async (who: Actor, input: Parameters<typeof saveVersion>[2]) => {
      try {
        await saveVersion(who, longLayout.id, input);
      } catch (e) {
        if (e instanceof HttpError) return { status: e.status, field: e.field, extra: e.extra };
        throw e;
      }
      throw new Error('saved');
    };
    expect(await refusal(outsider, { baseVersion: 121, body, note: '' })).toMatchObject({ status: 404, field: 'layoutId' });
    const foreign = { ...body, familyId: otherFamily.id };
    expect(await refusal(dealer, { baseVersion: 121, body: foreign, note: '' })).toMatchObject({ status: 400, field: 'body.familyId' });
    const stale = await refusal(dealer, { baseVersion: 119, body, note: '' });
    expect(stale).toMatchObject({ status: 409, field: 'baseVersion', extra: { currentVersion: 121 } });
    expect((stale.extra as { current: { version: number } }).current.version).toBe(121);
    expect([await versions(), await audits()]).toEqual([v0, a0]);
  });
});

interface PlanNode {
  'Node Type': string;
  'Relation Name'?: string;
  'Actual Rows': number;
  Plans?: PlanNode[];
}
const flatten = (n: PlanNode): PlanNode[] => [n, ...(n.Plans ?? []).flatMap(flatten)];
