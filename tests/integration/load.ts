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

/**
 * Writers that create layouts as fast as the server acknowledges them, until stopped or until
 * the server goes away. Only writes answered with 201 count as acknowledged.
 */
export function writeLoad(c: Client, target: Target, { writers = 4 } = {}) {
  const acked: Ack[] = [];
  let running = true;
  let n = 0;
  const loops = Array.from({ length: writers }, async (_, w) => {
    while (running) {
      const note = `load ${w}-${n++}`;
      try {
        const res = await c.post(`/api/machines/${target.machineId}/layouts`, { name: note, body: target.body, note });
        if (res.status === 201) acked.push({ layoutId: res.body.layout.id, note });
      } catch {
        return; // connection refused or reset: the server is gone
      }
    }
  });
  return {
    acked,
    async stop() {
      running = false;
      await Promise.all(loops);
      return acked;
    },
  };
}
