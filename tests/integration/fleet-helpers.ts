import { expect } from 'vitest';
import type { Client } from './client';

/** Test helpers for the fleet, history and sharing suites: find seeded rows by their names. */

export interface MachineItem {
  id: string;
  nickname: string;
  serial: string;
  familyId: string;
  orgId: string;
  orgName: string;
  drum: string;
  vaneControl: string;
}

export async function machineByNickname(c: Client, nickname: string): Promise<MachineItem> {
  const res = await c.get(`/api/machines?q=${encodeURIComponent(nickname)}&pageSize=100`);
  expect(res.status).toBe(200);
  const m = (res.body.items as MachineItem[]).find((x) => x.nickname === nickname);
  if (!m) throw new Error(`no machine called ${nickname} for this user`);
  return m;
}

export async function firstLayoutOf(c: Client, machineId: string) {
  const res = await c.get(`/api/machines/${machineId}/layouts`);
  expect(res.status).toBe(200);
  const layout = res.body.layouts[0];
  if (!layout) throw new Error('machine has no layout');
  return layout as { id: string; name: string; currentVersion: number; machineId: string; orgId: string };
}

/** A fresh layout on a machine (started from a crop), so tests do not disturb seeded ones. */
export async function newLayout(c: Client, machineId: string, name: string, crop = 'wheat') {
  const res = await c.post(`/api/machines/${machineId}/layouts`, { name, crop, note: 'test start' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { layout: { id: string; name: string; currentVersion: number }; version: { body: any; version: number } };
}

/** Saves a changed copy of the current version; returns the new version number. */
export async function saveChanged(c: Client, layoutId: string, change: (body: any) => void, note = 'changed') {
  const cur = await c.get(`/api/layouts/${layoutId}`);
  expect(cur.status).toBe(200);
  const body = structuredClone(cur.body.current.body);
  change(body);
  const res = await c.put(`/api/layouts/${layoutId}`, { baseVersion: cur.body.layout.currentVersion, body, note });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.version.version as number;
}

export const uniq = (prefix: string) => `${prefix}-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 6)}`;

/** A new machine of the same family, drum and vanes as `like`, in the client's own organisation; returns its id. */
export async function newMachineLike(c: Client, like: MachineItem, nickname: string, serialPrefix: string): Promise<string> {
  const res = await c.post('/api/machines', {
    familyId: like.familyId,
    drum: like.drum,
    vaneControl: like.vaneControl,
    serial: uniq(serialPrefix),
    nickname,
  });
  if (res.status !== 201) throw new Error(`machine ${nickname}: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.machine.id as string;
}
