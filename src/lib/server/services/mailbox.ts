/**
 * The fake mailbox as an administrator sees it. The instance administrator sees every message;
 * a dealer administrator only those sent to their dealer (its parts desk, its people) or to its
 * customer farms (owners and members). Nothing here names a server path.
 */
import { eq, inArray } from 'drizzle-orm';
import { getDb } from '~/lib/server/db';
import { memberships, organisations, users } from '~/db/schema';
import { isInstanceAdmin, type Actor } from '~/lib/server/access';
import { readMailbox, type StoredMessage } from './mail';

/** How many of the newest messages a dealer's view is picked from. */
const SCAN = 2000;

const address = (s: string) => (/<([^>]+)>/.exec(s)?.[1] ?? s).trim().toLowerCase();

/** Every address that concerns the organisations an actor sees. */
async function addressesOf(orgIds: string[]): Promise<Set<string>> {
  if (!orgIds.length) return new Set();
  const db = await getDb();
  const [orgs, people] = await Promise.all([
    db
      .select({ desk: organisations.partsDeskEmail, owner: organisations.ownerEmail })
      .from(organisations)
      .where(inArray(organisations.id, orgIds)),
    db
      .select({ email: users.email })
      .from(users)
      .innerJoin(memberships, eq(memberships.userId, users.id))
      .where(inArray(memberships.orgId, orgIds)),
  ]);
  const out = new Set<string>();
  for (const o of orgs) for (const a of [o.desk, o.owner]) if (a) out.add(a.toLowerCase());
  for (const p of people) out.add(p.email.toLowerCase());
  return out;
}

function concerns(m: StoredMessage, mine: Set<string>): boolean {
  return [...(m.envelope?.to ?? []), ...(m.to ?? []), ...(m.cc ?? [])].some((a) => mine.has(address(a)));
}

export interface MailboxView {
  /** False when mail goes to a real mail server (no local mailbox to read). */
  local: boolean;
  scope: 'instance' | 'dealer';
  total: number;
  messages: StoredMessage[];
}

export async function mailboxFor(actor: Actor, limit = 100): Promise<MailboxView> {
  if (isInstanceAdmin(actor)) {
    const box = await readMailbox(limit);
    return { local: box.dir !== null, scope: 'instance', total: box.total, messages: box.messages };
  }
  const box = await readMailbox(SCAN);
  const mine = await addressesOf(actor.visibleOrgIds);
  const messages = box.messages.filter((m) => concerns(m, mine));
  return { local: box.dir !== null, scope: 'dealer', total: messages.length, messages: messages.slice(0, limit) };
}
