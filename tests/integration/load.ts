import { machineWithLayout, type Client } from './client';

export interface Target {
  machineId: string;
  body: Record<string, unknown>;
}

/** The first machine on the signed-in user's home page and the body of its first layout. */
export async function firstMachineAndLayout(c: Client): Promise<Target> {
  const { machineId, layout } = await machineWithLayout(c);
  const got = await c.get(`/api/layouts/${layout.id}`);
  return { machineId, body: got.body.current.body };
}

export interface Ack {
  layoutId: string;
  note: string;
}

/** One writer's own layout, saved over and over: every note it sent, in order, and the last one acknowledged. */
export interface UpdateTrail {
  layoutId: string;
  sent: string[];
  lastAcked: number;
}

/**
 * Writers that create layouts and save new versions of a layout of their own, as fast as the
 * server acknowledges them, until stopped or until the server goes away. Only a 201 counts as
 * acknowledged; every other answer is kept in `unexpected` (a 5xx, or a 409 on a layout only its
 * writer saves, is a fault), so a test can fail on it instead of dropping it.
 */
export function writeLoad(c: Client, target: Target, { writers = 4 } = {}) {
  const acked: Ack[] = [];
  const trails: UpdateTrail[] = [];
  const unexpected: { method: string; status: number }[] = [];
  let running = true;
  let n = 0;
  const loops = Array.from({ length: writers }, async (_, w) => {
    let trail: UpdateTrail | undefined;
    let version = 1;
    while (running) {
      try {
        const note = `load ${w}-${n++}`;
        const res = await c.post(`/api/machines/${target.machineId}/layouts`, { name: note, body: target.body, note });
        if (res.status !== 201) {
          unexpected.push({ method: 'POST', status: res.status });
          continue;
        }
        acked.push({ layoutId: res.body.layout.id, note });
        if (!trail) {
          trail = { layoutId: res.body.layout.id, sent: [note], lastAcked: 0 };
          trails.push(trail);
          continue;
        }
        const update = `save ${w}-${n++}`;
        trail.sent.push(update);
        const saved = await c.put(`/api/layouts/${trail.layoutId}`, { baseVersion: version, body: target.body, note: update });
        if (saved.status !== 201) {
          unexpected.push({ method: 'PUT', status: saved.status });
          continue;
        }
        version = saved.body.version.version;
        trail.lastAcked = trail.sent.length - 1;
      } catch {
        return; // connection refused or reset: the server is gone
      }
    }
  });
  return {
    acked,
    trails,
    unexpected,
    async stop() {
      running = false;
      await Promise.all(loops);
      return acked;
    },
  };
}
