import type { Db } from './db';
import * as t from '~/db/schema';
import { demoCatalog, demoFamilies } from '~/lib/domain/demo-catalog';
import { starterLayout } from '~/lib/domain/starter';
import { hashPassword } from './auth/passwords';
import { DEMO_PASSWORD } from './seed';

/**
 * A second, unrelated dealer with its own customer farm, loaded only when
 * CAGEWRIGHT_TEST_FIXTURES=1 (the integration suite sets it). It lets the role matrix prove that
 * dealer staff never see another dealer's resources. Invented like the demo.
 */
export const FIXTURE_USERS = {
  otherTechnician: 'tech@brackenridge.example',
  otherTrainer: 'trainer@brackenridge.example',
  otherAdmin: 'admin@brackenridge.example',
  otherOperator: 'op@fenwick.example',
} as const;

export async function seedTestFixtures(db: Db) {
  const hash = await hashPassword(DEMO_PASSWORD);
  await db.transaction(async (tx) => {
    const [dealer] = await tx
      .insert(t.organisations)
      .values({ name: 'Brackenridge Ag Supply', kind: 'dealer', partsDeskEmail: 'parts@brackenridge.example', currency: 'EUR' })
      .returning();
    const [farm] = await tx
      .insert(t.organisations)
      .values({ name: 'Fenwick Acres', kind: 'farm', dealerId: dealer!.id, ownerEmail: 'op@fenwick.example' })
      .returning();
    const people = [
      [FIXTURE_USERS.otherTechnician, 'Rowan Pike', dealer!.id, 'technician'],
      [FIXTURE_USERS.otherTrainer, 'Mara Quill', dealer!.id, 'trainer'],
      [FIXTURE_USERS.otherAdmin, 'Ivo Stenner', dealer!.id, 'dealer_admin'],
      [FIXTURE_USERS.otherOperator, 'June Fenwick', farm!.id, 'operator'],
    ] as const;
    let operatorId = '';
    for (const [email, name, orgId, role] of people) {
      const [u] = await tx.insert(t.users).values({ email, name, passwordHash: hash }).returning();
      await tx.insert(t.memberships).values({ userId: u!.id, orgId, role });
      if (role === 'operator') operatorId = u!.id;
    }
    const family = demoFamilies[0]!;
    const layout = starterLayout(family, 'barley', demoCatalog);
    const [machine] = await tx
      .insert(t.machines)
      .values({
        orgId: farm!.id,
        familyId: family.id,
        drum: layout.drum,
        vaneControl: layout.vaneControl,
        serial: 'FA-0001',
        nickname: 'Fenwick One',
      })
      .returning();
    await tx.insert(t.installed).values({ machineId: machine!.id, layout, updatedBy: operatorId });
    const [plan] = await tx
      .insert(t.layouts)
      .values({ machineId: machine!.id, orgId: farm!.id, name: 'barley setup', createdBy: operatorId })
      .returning();
    await tx.insert(t.layoutVersions).values({ layoutId: plan!.id, version: 1, body: layout, createdBy: operatorId });
  });
}
