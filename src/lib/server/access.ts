import { and, eq, inArray } from 'drizzle-orm';
import type { Db } from './db';
import { memberships, organisations, users, type Role } from '../../db/schema';

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

const DEALER_STAFF: Role[] = ['technician', 'trainer', 'admin'];

export async function loadActor(db: Db, userId: string): Promise<Actor | null> {
  const rows = await db
    .select({
      id: users.id,
      email: users.email,
      name: users.name,
      unitSystem: users.unitSystem,
      orgId: memberships.orgId,
      role: memberships.role,
      orgKind: organisations.kind,
    })
    .from(users)
    .innerJoin(memberships, eq(memberships.userId, users.id))
    .innerJoin(organisations, eq(organisations.id, memberships.orgId))
    .where(eq(users.id, userId))
    .orderBy(organisations.kind, organisations.name);
  if (rows.length === 0) return null;
  // Dealer memberships sort first ('dealer' < 'farm'), so dealer staff act for the dealer.
  const home = rows[0];
  const memberOrgIds = rows.map((r) => r.orgId);
  const dealerIds = rows.filter((r) => r.orgKind === 'dealer' && DEALER_STAFF.includes(r.role)).map((r) => r.orgId);
  let customerIds: string[] = [];
  if (dealerIds.length > 0) {
    const farms = await db
      .select({ id: organisations.id })
      .from(organisations)
      .where(and(eq(organisations.kind, 'farm'), inArray(organisations.dealerId, dealerIds)));
    customerIds = farms.map((f) => f.id);
  }
  return {
    id: home.id,
    email: home.email,
    name: home.name,
    role: home.role,
    unitSystem: home.unitSystem,
    memberOrgIds,
    visibleOrgIds: [...new Set([...memberOrgIds, ...customerIds])],
    homeOrgId: home.orgId,
    homeOrgKind: home.orgKind,
  };
}

export function canSeeOrg(actor: Actor, orgId: string): boolean {
  return actor.visibleOrgIds.includes(orgId);
}

export const ALL_ROLES: readonly Role[] = ['operator', 'technician', 'trainer', 'admin'];
