/**
 * The trainer's demo deck "Small grains vs pulses": a wheat layout from a customer's machine,
 * a field-pea start, the wheat cage wrongly left in for peas, and lentils on the split cage.
 * Invented teaching material; trade facts are common practice, no published source.
 */
import { eq, inArray } from 'drizzle-orm';
import type { Db } from './db';
import * as t from '~/db/schema';
import { demoCatalog, demoFamilies } from '~/lib/domain/demo-catalog';
import { starterLayout } from '~/lib/domain/starter';
import type { Layout } from '~/lib/domain/schemas';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

export const DEMO_DECK_TITLE = 'Small grains vs pulses';

export async function seedDemoDeck(db: Db | Tx, who: { orgId: string; trainerId: string }) {
  const modular = demoFamilies.find((f) => f.cageKind === 'modular')!;
  const split = demoFamilies.find((f) => f.cageKind === 'split')!;

  // A wheat layout saved on one of the dealer's customer machines, if there is one.
  const farms = await db.select({ id: t.organisations.id }).from(t.organisations).where(eq(t.organisations.dealerId, who.orgId));
  const versions = farms.length
    ? await db
        .select({ id: t.layoutVersions.id, body: t.layoutVersions.body, nickname: t.machines.nickname })
        .from(t.layoutVersions)
        .innerJoin(t.layouts, eq(t.layouts.id, t.layoutVersions.layoutId))
        .innerJoin(t.machines, eq(t.machines.id, t.layouts.machineId))
        .where(
          inArray(
            t.layouts.orgId,
            farms.map((f) => f.id),
          ),
        )
    : [];
  const wheat = versions.find((v) => v.body.crop === 'wheat' && v.body.familyId === modular.id);

  const wheatStart = starterLayout(modular, 'wheat', demoCatalog);
  const wrongForPeas: Layout = { ...(wheat?.body ?? wheatStart), crop: 'field-peas' };

  const slides: { title: string; notes: string; layoutVersionId?: string; sampleLayout?: Layout }[] = [
    {
      title: wheat ? `Small grains: wheat on ${wheat.nickname}` : 'Small grains: a wheat cage',
      ...(wheat ? { layoutVersionId: wheat.id } : { sampleLayout: wheatStart }),
      notes: [
        '- **Fine-wire elements in the threshing zone** rub the heads hard and hold the small kernel until it is free.',
        '- **Wide-wire at the rear** lets loose kernels drop through quickly, so little goes out over the rotor.',
        '- Rasp bars, with spike rasp bars on the in-line mounts: straight bars cost power and are not needed in small grains (common practice).',
        '',
        '*Ask the class:* what happens to a pea on this cage?',
      ].join('\n'),
    },
    {
      title: 'Pulses: a field-pea start',
      sampleLayout: starterLayout(modular, 'field-peas', demoCatalog),
      notes: [
        '- **Round-bar elements** thresh gently: a pea rubbed like wheat splits.',
        '- The openings are wide enough for the pea to drop through at once — see the passage figures.',
        '- Rotor speed much lower than for wheat: peas start at 350 rpm, the lowest speed that threshes (NDSU Crop & Pest Report, 2008); wheat starts near 490 rpm on the same rotor (Harrison, 1975).',
        '- Concave wide: as wide as still threshes all pods (NDSU, 2008); close it only as losses call for it.',
        '- Vanes on *fast*: pods open easily, so keep the crop moving.',
      ].join('\n'),
    },
    {
      title: 'What goes wrong: the wheat cage left in for peas',
      sampleLayout: wrongForPeas,
      notes: [
        '- The rules flag the **fine-wire** elements: the pea cannot pass the opening and the rubbing cracks it.',
        '- The rotor speed was set for wheat: it sits at the top of the range for peas. Peas want the lowest speed that threshes (NDSU Crop & Pest Report, 2008), so bring it down towards the start band the rules name.',
        '- Open the comparison with the pea start to see every change in one list.',
      ].join('\n'),
    },
    {
      title: 'Lentils on the split cage',
      sampleLayout: starterLayout(split, 'lentils', demoCatalog),
      notes: [
        '- On a split cage, concaves stay in front and grates at the rear: plan each zone on its own.',
        '- A lentil is flat, so it passes a slot lying flat: the narrow way of the opening is what counts.',
      ].join('\n'),
    },
  ];

  const [deck] = await db.insert(t.decks).values({ orgId: who.orgId, title: DEMO_DECK_TITLE, createdBy: who.trainerId }).returning();
  await db.insert(t.deckSlides).values(
    slides.map((s, i) => ({
      deckId: deck!.id,
      position: i + 1,
      title: s.title,
      notes: s.notes,
      layoutVersionId: s.layoutVersionId ?? null,
      sampleLayout: s.sampleLayout ?? null,
    })),
  );
  return deck!;
}
