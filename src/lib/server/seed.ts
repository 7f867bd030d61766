import type { Db } from './db';
import * as t from '~/db/schema';
import { demoCatalog, demoFamilies } from '~/lib/domain/demo-catalog';
import { starterLayout } from '~/lib/domain/starter';
import type { CropId, DrumId, Layout, MachineFamily, VaneControl } from '~/lib/domain/schemas';
import { hashPassword } from './auth/passwords';
import { seedDemoDeck } from './demo-deck';
import { seedDemoJobs } from './demo-jobs';

/**
 * The invented demo: one dealer with a parts desk and a trainer, two farms, three machines of
 * two families, a starter catalog, stock, and a first layout on each machine. Every name,
 * person, farm and part number here is made up. Demo passwords are for the demo only.
 */
export const DEMO_PASSWORD = 'cage-demo-2026';

export const DEMO_USERS = [
  { email: 'olive@larkspur.example', name: 'Olive Marsh', org: 'larkspur', role: 'operator' },
  { email: 'dev@haldane.example', name: 'Dev Haldane', org: 'haldane', role: 'operator' },
  { email: 'tomas@kestrel.example', name: 'Tomas Reyes', org: 'kestrel', role: 'technician' },
  { email: 'priya@kestrel.example', name: 'Priya Nand', org: 'kestrel', role: 'trainer' },
  { email: 'admin@kestrel.example', name: 'Ada Brennan', org: 'kestrel', role: 'dealer_admin' },
  { email: 'noor@cagewright.example', name: 'Noor Ashdown', org: 'instance', role: 'instance_admin' },
] as const;

function familyOfKind(kind: MachineFamily['cageKind']): MachineFamily {
  const f = demoFamilies.find((x) => x.cageKind === kind);
  if (!f) throw new Error(`demo catalog has no ${kind} family`);
  return f;
}

function pickDrum(f: MachineFamily, wanted: DrumId): DrumId {
  return f.drumOptions.some((d) => d.id === wanted) ? wanted : f.drumOptions[0]!.id;
}
function pickVane(f: MachineFamily, wanted: VaneControl): VaneControl {
  return f.vaneControls.includes(wanted) ? wanted : f.vaneControls[0]!;
}

export async function seedDemo(db: Db) {
  const hash = await hashPassword(DEMO_PASSWORD);
  await db.transaction(async (tx) => {
    const [kestrel] = await tx
      .insert(t.organisations)
      .values({
        name: 'Kestrel Valley Implement',
        kind: 'dealer',
        partsDeskEmail: 'parts@kestrel.example',
        currency: 'CAD',
      })
      .returning();
    const [larkspur] = await tx
      .insert(t.organisations)
      .values({
        name: 'Larkspur Farms',
        kind: 'farm',
        dealerId: kestrel!.id,
        ownerEmail: 'olive@larkspur.example',
      })
      .returning();
    const [haldane] = await tx
      .insert(t.organisations)
      .values({
        name: 'Haldane Brothers',
        kind: 'farm',
        dealerId: kestrel!.id,
        ownerEmail: 'dev@haldane.example',
      })
      .returning();
    // The installation itself: holds the instance administrator, who sees no tenant's machines.
    const [instance] = await tx.insert(t.organisations).values({ name: 'Cagewright installation', kind: 'instance' }).returning();
    const orgs = { kestrel: kestrel!, larkspur: larkspur!, haldane: haldane!, instance: instance! };

    const userIds: Record<string, string> = {};
    for (const u of DEMO_USERS) {
      const [row] = await tx.insert(t.users).values({ email: u.email, name: u.name, passwordHash: hash }).returning();
      userIds[u.email] = row!.id;
      await tx.insert(t.memberships).values({ userId: row!.id, orgId: orgs[u.org].id, role: u.role });
    }

    for (const f of demoFamilies) await tx.insert(t.families).values({ id: f.id, name: f.name, spec: f });
    const familyByGroup = new Map(demoFamilies.map((f) => [f.fitGroup, f.id]));
    for (const p of demoCatalog) {
      await tx.insert(t.catalogParts).values({
        partNumber: p.partNumber,
        familyId: familyByGroup.get(p.fitGroup) ?? demoFamilies[0]!.id,
        kind: p.kind,
        spec: p,
      });
    }
    // The dealer keeps a few of most parts; farms keep a handful of spares. Lead times of an
    // order are invented for the demo: 3 to 21 days, and none given for every eleventh part.
    const dealerStock = demoCatalog.map((p, i) => ({
      orgId: kestrel!.id,
      partNumber: p.partNumber,
      quantity: (i * 7) % 5,
      leadDays: i % 11 === 10 ? null : [3, 5, 7, 10, 14, 21][i % 6]!,
    }));
    await tx.insert(t.stock).values(dealerStock);
    // The dealer's own price list, started at the catalog's list prices (its administrator edits it).
    await tx
      .insert(t.dealerPrices)
      .values(demoCatalog.map((p) => ({ dealerId: kestrel!.id, partNumber: p.partNumber, priceCents: p.priceCents })));

    const modular = familyOfKind('modular');
    const split = familyOfKind('split');
    const fleet: {
      org: keyof typeof orgs;
      family: MachineFamily;
      drum: DrumId;
      vane: VaneControl;
      serial: string;
      nickname: string;
      crop: CropId;
      notes: string;
    }[] = [
      {
        org: 'larkspur',
        family: modular,
        drum: 'slim',
        vane: 'powered',
        serial: 'LK-2291-A',
        nickname: 'North Quarter',
        crop: 'wheat',
        notes: 'Bought used in 2024; new rasp bars fitted last spring.',
      },
      {
        org: 'haldane',
        family: split,
        drum: 'full',
        vane: 'manual',
        serial: 'HB-7730-S',
        nickname: 'Creekside',
        crop: 'corn',
        notes: 'Corn and soybeans on the river ground.',
      },
      {
        org: 'haldane',
        family: modular,
        drum: 'full',
        vane: 'fixed',
        serial: 'HB-4410-M',
        nickname: 'Bean Runner',
        crop: 'soybeans',
        notes: 'Kept for edible beans and soybeans.',
      },
    ];
    for (const m of fleet) {
      const drum = pickDrum(m.family, m.drum);
      const vaneControl = pickVane(m.family, m.vane);
      const [machine] = await tx
        .insert(t.machines)
        .values({
          orgId: orgs[m.org].id,
          familyId: m.family.id,
          drum,
          vaneControl,
          serial: m.serial,
          nickname: m.nickname,
          notes: m.notes,
        })
        .returning();
      // The starter on this machine's own drum and vanes: the slim drum runs its crop's window 100 rpm
      // higher (common practice), and the vane setting is one this vane control can take.
      const layout: Layout = starterLayout(m.family, m.crop, demoCatalog, { drum, vaneControl });
      const owner = m.org === 'larkspur' ? userIds['olive@larkspur.example'] : userIds['dev@haldane.example'];
      const [plan] = await tx
        .insert(t.layouts)
        .values({
          machineId: machine!.id,
          orgId: orgs[m.org].id,
          name: `${m.crop.replace('-', ' ')} setup`,
          currentVersion: 1,
          createdBy: owner,
        })
        .returning();
      await tx
        .insert(t.layoutVersions)
        .values({ layoutId: plan!.id, version: 1, body: layout, note: 'As installed at the start of the season', createdBy: owner });
      await tx.insert(t.installed).values({ machineId: machine!.id, layout, sourceLayoutId: plan!.id, sourceVersion: 1, updatedBy: owner });
      // A few spares on the farm's shelf: the parts of this layout's first position.
      const spares = layout.elements.filter((e) => e.position === 1).map((e) => e.partNumber);
      for (const pn of spares) {
        await tx.insert(t.stock).values({ orgId: orgs[m.org].id, partNumber: pn, quantity: 1 }).onConflictDoNothing();
      }
    }
    await seedDemoDeck(tx, { orgId: kestrel!.id, trainerId: userIds['priya@kestrel.example']! });
    // Shop work (job cards): the dealer's flat rates and one planned job card, invented.
    await seedDemoJobs(tx, { dealerId: kestrel!.id, technicianId: userIds['tomas@kestrel.example']! });
    await tx.insert(t.auditLog).values({ action: 'seed', entity: 'demo', detail: { machines: fleet.length } });
  });
  await (await import('./demo-inspection')).seedDemoInspection(db);
  await (await import('./demo-field')).seedDemoField(db);
  // Shop work (wear): two seasons of hours, inspections with wear and part history (demo-wear.ts).
  await (await import('./demo-wear')).seedDemoWear(db);
  // End of shop work (wear).
}
