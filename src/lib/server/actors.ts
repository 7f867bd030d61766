import { sql } from 'drizzle-orm';
import type { Db, Store } from './db';
import { rolesFor, type Actor } from './access';
import type { Role } from '~/db/schema';

/**
 * One round trip: the user, their memberships and, for dealer staff, the dealer's farms, but
 * only while the session `sessionId` of that user is open (not ended, not expired): a signed-out
 * or revoked session loads no actor.
 */
export async function loadActor(db: Db, userId: string, sessionId: string): Promise<Actor | null> {
  const result = await db.execute(sql`
    select u.id, u.email, u.name, u.unit_system, m.org_id, m.role, o.kind as org_kind,
      case when o.kind = 'dealer' and m.role in (${sql.join(
        rolesFor('customers.see').map((r) => sql`${r}`),
        sql`, `,
      )})
        then (select coalesce(array_agg(f.id::text), '{}') from organisations f where f.kind = 'farm' and f.dealer_id = o.id)
        else '{}'::text[] end as customer_ids
    from users u
    join memberships m on m.user_id = u.id
    join organisations o on o.id = m.org_id
    join sessions s on s.id = ${sessionId} and s.user_id = u.id and s.ended_at is null and s.expires_at > now()
    where u.id = ${userId}
    order by o.kind, o.name`);
  const rows = result.rows as {
    id: string;
    email: string;
    name: string;
    unit_system: 'metric' | 'imperial';
    org_id: string;
    role: Role;
    org_kind: 'farm' | 'dealer' | 'instance';
    customer_ids: string[];
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

/**
 * Actors loaded lately, by session id, kept only with the embedded store: then this process is
 * the one owner of the data, and every change to users, memberships, organisations and sessions
 * goes through it and calls `forgetActors()` (services/users.ts, services/orgs.ts, sign-out in
 * auth.config.ts). With a PostgreSQL server
 * other processes may write, so every request reads the store. An entry lives a few seconds at
 * most as a second guard. A load that overlaps a change is not kept (the generation moved on).
 */
const ACTOR_TTL_MS = 3000;
const ACTOR_CAP = 2000;
const recentActors = new Map<string, { actor: Actor; at: number }>();
let actorGeneration = 0;

/** Drops every kept actor: call after a write to users, memberships, organisations or sessions commits. */
export function forgetActors(): void {
  actorGeneration++;
  recentActors.clear();
}

/** The actor for an open session, from the store or from the last few seconds (see above). */
export async function actorFor(store: Pick<Store, 'db' | 'mode'>, userId: string, sessionId: string): Promise<Actor | null> {
  if (store.mode !== 'pglite') return loadActor(store.db, userId, sessionId);
  const now = Date.now();
  const key = `${userId}\u0000${sessionId}`;
  const kept = recentActors.get(key);
  if (kept && now - kept.at < ACTOR_TTL_MS) return kept.actor;
  const generation = actorGeneration;
  const actor = await loadActor(store.db, userId, sessionId);
  if (actor && generation === actorGeneration) {
    if (recentActors.size >= ACTOR_CAP) recentActors.delete(recentActors.keys().next().value!);
    recentActors.set(key, { actor: freeze(actor), at: now });
  }
  return actor;
}

function freeze(actor: Actor): Actor {
  Object.freeze(actor.memberOrgIds);
  Object.freeze(actor.visibleOrgIds);
  return Object.freeze(actor);
}
