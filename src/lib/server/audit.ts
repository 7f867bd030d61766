import type { Db } from './db';
import { auditLog } from '~/db/schema';
import type { Actor } from './access';

/** Record a write. Call inside the same transaction as the write it describes. */
export async function audit(
  db: Pick<Db, 'insert'>,
  actor: Pick<Actor, 'id' | 'homeOrgId'> | null,
  action: string,
  entity: string,
  entityId: string | null,
  detail: Record<string, unknown> = {},
  orgId?: string,
) {
  await db.insert(auditLog).values({
    userId: actor?.id ?? null,
    orgId: orgId ?? actor?.homeOrgId ?? null,
    action,
    entity,
    entityId,
    detail,
  });
}
