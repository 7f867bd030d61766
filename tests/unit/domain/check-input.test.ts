import { execFile } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { checkLayoutInput, demoFamilies } from '~/lib/domain';
import { catalog, setElement, start } from './helpers';

const run = (input: unknown) => checkLayoutInput(input, demoFamilies, catalog);
const problems = (input: unknown) => {
  const r = run(input);
  return r.ok ? [] : r.problems;
};

describe('checkLayoutInput (shared by the check command and the check route)', () => {
  it('checks a valid layout and computes its settings', () => {
    const r = run(JSON.parse(JSON.stringify(setElement(start('wheat'), 1, 'left', 'CW-FW-R-04'))));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.findings.map((f) => f.code)).toEqual(['FIT_HAND_MISMATCH']);
    expect(r.settings.rpmInWindow).toBe(true);
    expect(r.family.id).toBe('tamarack-m4');
  });
  it('names the field of an unknown element', () => {
    const l = start('wheat');
    const bad = { ...l, elements: l.elements.map((e, i) => (i === 3 ? { ...e, partNumber: 'CW-ZZ-L-99' } : e)) };
    expect(problems(bad)).toEqual([{ path: 'elements.3.partNumber', message: 'unknown part number "CW-ZZ-L-99"' }]);
  });
  it('names the field of a part of the wrong kind', () => {
    const l = start('wheat');
    expect(problems({ ...l, rotorBars: [{ row: 1, position: 1, partNumber: 'CW-FW-L-04' }] })[0]).toMatchObject({
      path: 'rotorBars.0.partNumber',
    });
  });
  it('names an unknown family', () => {
    expect(problems({ ...start('wheat'), familyId: 'nowhere-x9' })[0]).toMatchObject({ path: 'familyId' });
  });
  it('names an absurd rpm and wrong types', () => {
    const p = problems({ ...start('wheat'), rotorRpm: 1e6, clearanceMm: 'wide' });
    expect(p.map((x) => x.path).sort()).toEqual(['clearanceMm', 'rotorRpm']);
  });
  it('says which required fields are missing', () => {
    const { crop: _c, drum: _d, ...rest } = start('wheat');
    expect(problems(rest)).toEqual([
      { path: 'crop', message: 'required field is missing' },
      { path: 'drum', message: 'required field is missing' },
    ]);
  });
  it('never throws on junk', () => {
    for (const junk of [null, 42, 'layout', [], {}, { elements: 'x' }, { format: 'cagewright.layout/1', elements: [null] }])
      expect(run(junk).ok).toBe(false);
  });
});

describe('npm run check (scripts/check-layout.ts)', () => {
  const exec = promisify(execFile);
  const dir = mkdtempSync(join(tmpdir(), 'cagewright-check-'));
  const file = (name: string, content: unknown) => {
    const p = join(dir, name);
    writeFileSync(p, typeof content === 'string' ? content : JSON.stringify(content));
    return p;
  };
  const check = async (path: string) => {
    try {
      const { stdout, stderr } = await exec('npx', ['tsx', 'scripts/check-layout.ts', path], { cwd: join(__dirname, '../../..') });
      return { code: 0, stdout, stderr };
    } catch (e) {
      const err = e as { code: number; stdout: string; stderr: string };
      return { code: err.code, stdout: err.stdout, stderr: err.stderr };
    }
  };
  it('prints findings and settings as JSON for a valid layout, exit 0', async () => {
    const r = await check(file('ok.json', start('corn')));
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.findings).toEqual([]);
    expect(out.settings.crop).toBe('corn');
  }, 30_000);
  it('exits non-zero naming the field of an unknown element', async () => {
    const r = await check(file('bad.json', setElement(start('corn'), 2, 'right', 'CW-QQ-R-01')));
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/elements\.\d+\.partNumber: unknown part number "CW-QQ-R-01"/);
  }, 30_000);
  it('exits non-zero for a file that is not JSON', async () => {
    const r = await check(file('junk.json', '{ nope'));
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/not JSON/);
  }, 30_000);
});
