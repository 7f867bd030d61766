import { and, count, desc, eq, inArray } from 'drizzle-orm';
import { getDb } from '~/lib/server/db';
import { machines, organisations, partsRequests, decks, families, users } from '~/db/schema';
import type { Actor } from '~/lib/server/access';

export interface HomeSummary {
  orgs: { id: string; name: string; kind: 'farm' | 'dealer' | 'instance' }[];
  machines: { id: string; nickname: string; serial: string; familyName: string; orgName: string }[];
  openPartsRequests: number;
  /** Parts requests still being written (not sent) in the organisations the user sees. */
  draftPartsRequests: number;
  decks: number;
}

/** What the home page shows: the organisations and machines the user can see, and open work. */
export async function homeSummary(actor: Actor): Promise<HomeSummary> {
  const db = await getDb();
  const visible = actor.visibleOrgIds;
  const [orgs, machineRows, [requests], [deckCount], [drafts]] = await Promise.all([
    db
      .select({ id: organisations.id, name: organisations.name, kind: organisations.kind })
      .from(organisations)
      .where(inArray(organisations.id, visible))
      .orderBy(organisations.kind, organisations.name),
    db
      .select({
        id: machines.id,
        nickname: machines.nickname,
        serial: machines.serial,
        familyName: families.name,
        orgName: organisations.name,
      })
      .from(machines)
      .innerJoin(families, eq(families.id, machines.familyId))
      .innerJoin(organisations, eq(organisations.id, machines.orgId))
      .where(inArray(machines.orgId, visible))
      .orderBy(desc(machines.updatedAt))
      .limit(8),
    db
      .select({ n: count() })
      .from(partsRequests)
      .where(
        and(
          actor.homeOrgKind === 'dealer' ? inArray(partsRequests.dealerOrgId, actor.memberOrgIds) : inArray(partsRequests.orgId, visible),
          inArray(partsRequests.status, ['sent', 'acknowledged', 'ready']),
        ),
      ),
    db.select({ n: count() }).from(decks).where(inArray(decks.orgId, visible)),
    db
      .select({ n: count() })
      .from(partsRequests)
      .where(and(inArray(partsRequests.orgId, visible), eq(partsRequests.status, 'draft'))),
  ]);
  return { orgs, machines: machineRows, openPartsRequests: requests?.n ?? 0, draftPartsRequests: drafts?.n ?? 0, decks: deckCount?.n ?? 0 };
}

/** The instance administrator's overview: how many dealers, farms and people the installation holds. */
export async function instanceSummary() {
  const db = await getDb();
  const [orgs, [people]] = await Promise.all([
    db.select({ kind: organisations.kind, n: count() }).from(organisations).groupBy(organisations.kind),
    db.select({ n: count() }).from(users),
  ]);
  const of = (kind: string) => orgs.find((o) => o.kind === kind)?.n ?? 0;
  return { dealers: of('dealer'), farms: of('farm'), users: people?.n ?? 0 };
}
