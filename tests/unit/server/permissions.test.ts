import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { roles as schemaRoles, type Role } from '~/db/schema';
import { ACTIONS, ALL_ROLES, can, PERMISSIONS, rolesFor } from '~/lib/server/access';
import { NAV, navFor } from '~/components/shell/nav';

const root = join(__dirname, '../../..');
const src = join(root, 'src');

/**
 * What each role's top navigation holds, written out by hand from the pages each role may use
 * (tests/integration/page-matrix.test.ts) and what each does there. Machines and field check are
 * about a tenant's machines, so the instance administrator, who belongs to no tenant, has none.
 */
const EXPECTED_NAV: Record<Role, string[]> = {
  operator: ['/', '/machines', '/planner', '/parts-requests', '/inspections', '/jobs', '/field-check'],
  technician: [
    '/',
    '/machines',
    '/planner',
    '/parts-requests',
    '/inspections',
    '/jobs',
    '/field-check',
    '/before-season',
    '/classroom',
    '/admin/catalog',
    '/admin/prices',
  ],
  trainer: ['/', '/machines', '/field-check', '/classroom'],
  dealer_admin: [
    '/',
    '/machines',
    '/planner',
    '/parts-requests',
    '/inspections',
    '/jobs',
    '/field-check',
    '/before-season',
    '/admin/catalog',
    '/admin/prices',
    '/admin/stock',
    '/admin/mailbox',
  ],
  instance_admin: ['/', '/admin/catalog', '/admin/mailbox', '/admin/backup'],
};

describe('the permission table', () => {
  it('knows every role of the store and only those', () => {
    expect([...ALL_ROLES].sort()).toEqual([...schemaRoles].sort());
    for (const action of ACTIONS) {
      expect(rolesFor(action).length, action).toBeGreaterThan(0);
      for (const role of rolesFor(action)) expect(schemaRoles, `${action}: ${role}`).toContain(role);
    }
  });

  it('can() answers from the table, for an actor or a bare role', () => {
    for (const action of ACTIONS)
      for (const role of ALL_ROLES) {
        expect(can(role, action), `${role} ${action}`).toBe(PERMISSIONS[action].includes(role));
        expect(can({ role }, action)).toBe(can(role, action));
      }
    // A few rows spelled out (the rules the routes have always kept).
    expect(can('dealer_admin', 'plans.make')).toBe(true);
    expect(can('trainer', 'layouts.write')).toBe(false);
    expect(can('instance_admin', 'catalog.write')).toBe(true);
    expect(can('dealer_admin', 'catalog.write')).toBe(false);
    expect(can('technician', 'prices.write')).toBe(false);
    expect(can('dealer_admin', 'lossChecks.write')).toBe(false);
    expect(can('technician', 'parts.desk')).toBe(true);
    expect(can('operator', 'parts.desk')).toBe(false);
  });
});

describe('the top navigation follows the permission table', () => {
  for (const role of ALL_ROLES) {
    it(`${role} sees exactly the sections can() allows`, () => {
      const shown = navFor(role).map((i) => i.href);
      expect(shown).toEqual(EXPECTED_NAV[role]);
      expect(shown).toEqual(NAV.filter((i) => !i.action || can(role, i.action)).map((i) => i.href));
    });
  }

  it('an administrator who may plan gets the planner link', () => {
    expect(can('dealer_admin', 'plans.make')).toBe(true);
    expect(navFor('dealer_admin').map((i) => i.label)).toContain('Crop change');
  });

  it('every section links to a page that exists', () => {
    for (const item of NAV) {
      const base = item.href === '/' ? 'index' : item.href.slice(1);
      const found = [`${base}.astro`, `${base}/index.astro`].some((p) => {
        try {
          return statSync(join(src, 'pages', p)).isFile();
        } catch {
          return false;
        }
      });
      expect(found, item.href).toBe(true);
    }
  });

  it('a section page that refuses some roles refuses them by the same action', () => {
    // Pages that answer 403 to a role check it with can(actor, '<action>').
    let guarded = 0;
    for (const item of NAV) {
      const base = item.href === '/' ? 'index' : item.href.slice(1);
      const file = [`${base}.astro`, `${base}/index.astro`]
        .map((p) => join(src, 'pages', p))
        .find((p) => {
          try {
            return statSync(p).isFile();
          } catch {
            return false;
          }
        })!;
      const page = readFileSync(file, 'utf8');
      if (!/response\.status = 403;/.test(page)) continue;
      guarded++;
      expect(page, item.href).toContain(`can(actor, '${item.action}')`);
    }
    expect(guarded).toBeGreaterThanOrEqual(6);
  });
});

describe('one home for roles', () => {
  function files(dir: string): string[] {
    return readdirSync(dir).flatMap((name) => {
      const p = join(dir, name);
      return statSync(p).isDirectory() ? files(p) : /\.(ts|tsx|astro|mjs)$/.test(name) ? [p] : [];
    });
  }
  const all = files(src);

  it('no file spells out a list of roles or casts one to test a role, but access.ts', () => {
    const ROLE = `'(?:operator|technician|trainer|dealer_admin|instance_admin)'`;
    const list = new RegExp(`\\[\\s*${ROLE}\\s*,`);
    const bad = all
      .filter((f) => !f.endsWith(join('lib', 'server', 'access.ts')) && !f.endsWith(join('db', 'schema', 'orgs.ts')))
      .flatMap((f) => {
        const text = readFileSync(f, 'utf8');
        const hits: string[] = [];
        if (list.test(text)) hits.push('role list');
        if (/as readonly (?:string|Role)\[\]\)\.includes\(/.test(text)) hits.push('cast includes');
        const names = [...text.matchAll(/\b[A-Z_]+_(?:WRITERS|ROLES|READERS|EDITORS|ADMINS)\b/g)].map((m) => m[0]);
        if (names.some((n) => n !== 'TENANT_ROLES' && n !== 'ALL_ROLES')) hits.push('a role list constant');
        return hits.map((h) => `${relative(root, f)}: ${h}`);
      });
    expect(bad).toEqual([]);
  });

  it('access.ts can be read in the browser: type imports only', () => {
    const text = readFileSync(join(src, 'lib/server/access.ts'), 'utf8');
    const imports = [...text.matchAll(/^import\s+(type\s+)?[^;]*?from\s*'([^']+)'/gm)];
    expect(imports.length).toBeGreaterThan(0);
    expect(imports.filter((m) => !m[1]).map((m) => m[2])).toEqual([]);
  });
});
