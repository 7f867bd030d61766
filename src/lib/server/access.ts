import { sql } from 'drizzle-orm';
import type { Db } from './db';
import type { Role } from '../../db/schema';

/** The signed-in person as every route sees them: identity, role and what they may see. */
export interface Actor {
  id: string;
  email: string;
  name: string;
  role: Role;
  unitSystem: 'metric' | 'imperial';
  /** Organisations the user is a member of. */
  memberOrgIds: string[];
  /** Member organisations plus, for dealer staff, the dealer's customer farms. */
  visibleOrgIds: string[];
  /** The organisation the user acts for by default (the first membership). */
  homeOrgId: string;
  homeOrgKind: 'farm' | 'dealer';
}

/** One round trip: the user, their memberships and, for dealer staff, the dealer's farms. */
export async function loadActor(db: Db, userId: string): Promise<Actor | null> {
  const result = await db.execute(sql`
    select u.id, u.email, u.name, u.unit_system, m.org_id, m.role, o.kind as org_kind,
      case when o.kind = 'dealer' and m.role in ('technician', 'trainer', 'admin')
        then (select coalesce(array_agg(f.id::text), '{}') from organisations f where f.kind = 'farm' and f.dealer_id = o.id)
        else '{}'::text[] end as customer_ids
    from users u
    join memberships m on m.user_id = u.id
    join organisations o on o.id = m.org_id
    where u.id = ${userId}
    order by o.kind, o.name`);
  const rows = result.rows as {
    id: string; email: string; name: string; unit_system: 'metric' | 'imperial';
    org_id: string; role: Role; org_kind: 'farm' | 'dealer'; customer_ids: string[];
  }[];
  // Dealer memberships sort first ('dealer' < 'farm'), so dealer staff act for the dealer.
  const home = rows[0];
  if (!home) return null;
  const memberOrgIds = rows.map((r) => r.org_id);
  const customerIds = rows.flatMap((r) => r.customer_ids ?? []);
  return {
    id: home.id,
    email: home.email,
    name: home.name,
    role: home.role,
    unitSystem: home.unit_system,
    memberOrgIds,
    visibleOrgIds: [...new Set([...memberOrgIds, ...customerIds])],
    homeOrgId: home.org_id,
    homeOrgKind: home.org_kind,
  };
}

export function canSeeOrg(actor: Actor, orgId: string): boolean {
  return actor.visibleOrgIds.includes(orgId);
}

export const ALL_ROLES: readonly Role[] = ['operator', 'technician', 'trainer', 'admin'];
