import { expect } from 'vitest';
import { demoCatalog, starterLayout, tamarackM4, type CropId, type Layout } from '~/lib/domain';
import type { Client } from './client';

/** Helpers for the planner and parts-request suites: a machine of our own with a known cage. */

let serial = 0;

/**
 * A new Tamarack M4 on the signed-in operator's farm with `installed` recorded in it (by default
 * the starter wheat cage), so tests never depend on what other suites did to the seeded machines.
 */
export async function ownMachine(c: Client, nickname: string, installed?: (l: Layout) => Layout, crop: CropId = 'wheat') {
  const drum = 'slim';
  const vaneControl = 'powered';
  const created = await c.post('/api/machines', {
    familyId: tamarackM4.id,
    drum,
    vaneControl,
    serial: `PL-${Date.now().toString(36).toUpperCase()}-${++serial}`,
    nickname,
  });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  const machineId: string = created.body.machine.id;
  const base = { ...starterLayout(tamarackM4, crop, demoCatalog), drum, vaneControl } as Layout;
  const layout = installed ? installed(base) : base;
  const put = await c.put(`/api/machines/${machineId}/installed`, { layout });
  expect(put.status, JSON.stringify(put.body)).toBe(200);
  return { machineId, installed: layout };
}

export async function tableCounts(admin: Client): Promise<Record<string, number>> {
  const res = await admin.get('/api/admin/stats');
  expect(res.status).toBe(200);
  return res.body.counts;
}

export async function mailbox(admin: Client) {
  const res = await admin.get('/api/admin/mailbox?limit=500');
  expect(res.status).toBe(200);
  return res.body as {
    local: boolean;
    scope: 'instance' | 'dealer';
    total: number;
    messages: {
      id: string;
      subject: string;
      from: string;
      to: string[];
      cc: string[];
      envelope: { from: string | null; to: string[] };
      text: string;
      attachments: { filename: string | null; contentType: string; size: number; content?: string }[];
    }[];
  };
}
