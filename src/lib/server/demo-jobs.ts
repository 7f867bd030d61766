/**
 * The demo's shop work: the dealer's own flat rates for a few kinds of step, and one planned job
 * card on a customer's machine. Invented: the minutes are no one's published times.
 */
import { and, eq } from 'drizzle-orm';
import type { Db } from './db';
import * as t from '~/db/schema';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

export const DEMO_JOB_TITLE = 'Pre-season look at the rotor bars';

export async function seedDemoJobs(db: Db | Tx, who: { dealerId: string; technicianId: string }) {
  await db.insert(t.flatRates).values([
    { dealerId: who.dealerId, kind: 'swap', minutes: 50 },
    { dealerId: who.dealerId, kind: 'replace', minutes: 45 },
  ]);
  const [machine] = await db
    .select({ id: t.machines.id, orgId: t.machines.orgId })
    .from(t.machines)
    .innerJoin(t.organisations, eq(t.organisations.id, t.machines.orgId))
    .where(and(eq(t.organisations.dealerId, who.dealerId), eq(t.machines.nickname, 'Creekside')))
    .limit(1);
  if (!machine) return;
  const [job] = await db
    .insert(t.jobCards)
    .values({
      machineId: machine.id,
      orgId: machine.orgId,
      title: DEMO_JOB_TITLE,
      origin: 'hand',
      assignedTo: who.technicianId,
      createdBy: who.technicianId,
    })
    .returning({ id: t.jobCards.id });
  const steps = [
    'Lock the rotor and look over every rasp bar for rounded edges, cracks and loose bolts.',
    'Turn the rotor by hand one full turn and listen for anything that rubs or knocks.',
    'Write down any bar to replace before the season on the inspection.',
  ];
  await db.insert(t.jobSteps).values(steps.map((text, position) => ({ jobId: job!.id, position, kind: 'check', text })));
}
