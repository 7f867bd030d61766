/**
 * Who may do what: the signed-in person (`Actor`) and one permission table, roles per action.
 * Routes call `requireActor(ctx, action)`, pages and services `can(actor, action)`, and the top
 * navigation is derived from the same table (`components/shell/nav.ts`).
 *
 * This module has type imports only, so islands and the navigation may read it in the browser;
 * loading an actor from the store lives in `actors.ts`.
 */
import type { Role } from '~/db/schema';

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
  homeOrgKind: 'farm' | 'dealer' | 'instance';
}

export const ALL_ROLES: readonly Role[] = ['operator', 'technician', 'trainer', 'dealer_admin', 'instance_admin'];
/** Roles a member of a farm or dealer may hold (the instance administrator belongs to no tenant). */
export const TENANT_ROLES = ['operator', 'technician', 'trainer', 'dealer_admin'] as const satisfies readonly Role[];

/** People who work on machines: record, plan, fit and order for them. */
const HANDS = ['operator', 'technician', 'dealer_admin'] as const satisfies readonly Role[];
/** Either administrator; what each sees is scoped in the service (see `isInstanceAdmin`). */
const ADMINS = ['dealer_admin', 'instance_admin'] as const satisfies readonly Role[];

/**
 * The permission table: every action and the roles that may take it. Visibility (which
 * organisation's rows) is separate: services filter by `actor.visibleOrgIds`.
 */
const TABLE = {
  /** The sections about a tenant's machines (machine list, field check); the instance administrator holds none. */
  'fleet.view': TENANT_ROLES,
  'machines.write': HANDS,
  'layouts.write': HANDS,
  /** Propose and accept crop-change plans (the planner). */
  'plans.make': HANDS,
  'shares.write': HANDS,
  'inspections.write': HANDS,
  /** Draft, edit and send parts requests (and see the parts-request pages). */
  'parts.request': HANDS,
  /**
   * Order parts for a layout with blocks-fit findings, giving a reason (kept on the request).
   * The instance administrator makes no parts requests, so only the dealer's people.
   */
  'parts.overrideFit': ['technician', 'dealer_admin'],
  /** The dealer's parts desk: move a request along its workflow. */
  'parts.desk': ['technician', 'dealer_admin'],
  'lossChecks.write': ['operator', 'technician'],
  /** Record a machine's engine and separator hours (also read at inspections, job cards, loss checks). */
  'hours.record': HANDS,
  /** See job cards, machine hours, part history and wear forecasts of the machines one sees. */
  'shop.view': HANDS,
  /** Open, plan, assign, work and sign off job cards. */
  'jobs.manage': ['technician', 'dealer_admin'],
  /** The dealer's flat-rate minutes per kind of job-card step. */
  'flatRates.write': ['dealer_admin'],
  /** The dealer's before-the-season list of customer machines with parts near their wear limit. */
  'season.list': ['technician', 'dealer_admin'],
  /** The classroom: decks, slides, deck links. */
  'decks.use': ['trainer', 'technician'],
  /** The catalog pages (the API's catalog reads are open to every signed-in role). */
  'catalog.read': ['technician', 'dealer_admin', 'instance_admin'],
  /** The shared machine-family catalog belongs to the installation. */
  'catalog.write': ['instance_admin'],
  'prices.read': ['technician', 'dealer_admin'],
  'prices.write': ['dealer_admin'],
  /** The dealer's shelf quantities and lead times (the planner reads them for its customers). */
  'stock.write': ['dealer_admin'],
  'startingValues.write': ['dealer_admin'],
  /** Add customer farms to the dealer. */
  'orgs.add': ['dealer_admin'],
  'users.list': ADMINS,
  /** Change a person's role or organisation. */
  'users.edit': ['dealer_admin'],
  'mailbox.read': ADMINS,
  'stats.read': ADMINS,
  /** Backups and restores of the installation. */
  'backup.run': ['instance_admin'],
  /** Dealer staff who see the dealer's customer farms (read when an actor is loaded). */
  'customers.see': ['technician', 'trainer', 'dealer_admin'],
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof TABLE;
export const PERMISSIONS: Readonly<Record<Action, readonly Role[]>> = TABLE;
export const ACTIONS = Object.keys(TABLE) as Action[];

/** The roles that may take `action`. */
export const rolesFor = (action: Action): readonly Role[] => PERMISSIONS[action];

/** Whether `who` (an actor, or a bare role) may take `action`. */
export function can(who: Pick<Actor, 'role'> | Role, action: Action): boolean {
  const role = typeof who === 'string' ? who : who.role;
  return PERMISSIONS[action].includes(role);
}

export function canSeeOrg(actor: Actor, orgId: string): boolean {
  return actor.visibleOrgIds.includes(orgId);
}

export const isInstanceAdmin = (actor: Pick<Actor, 'role'>): boolean => actor.role === 'instance_admin';

/** The dealer an actor works for (dealer staff), or null (farm people, instance administrators). */
export function dealerOf(actor: Pick<Actor, 'homeOrgId' | 'homeOrgKind'>): string | null {
  return actor.homeOrgKind === 'dealer' ? actor.homeOrgId : null;
}

/** Each role as people read it: the page header, the home page, request sheets and e-mails. */
export const ROLE_LABEL: Record<Role, string> = {
  operator: 'Operator',
  technician: 'Service technician',
  trainer: 'Trainer',
  dealer_admin: 'Dealer administrator',
  instance_admin: 'Instance administrator',
};
