import type { Role } from '~/db/schema';
import { can, type Action } from '~/lib/server/access';

export interface NavItem {
  href: string;
  label: string;
  /** The action the section is for (`access.ts`); none: everyone signed in. */
  action?: Action;
}

/**
 * The app's sections, each tied to the action it serves; who sees a link follows from the
 * permission table, never from a list of its own. Each page still checks on the server.
 */
export const NAV: readonly NavItem[] = [
  { href: '/', label: 'Home' },
  { href: '/machines', label: 'Machines', action: 'fleet.view' },
  { href: '/planner', label: 'Crop change', action: 'plans.make' },
  { href: '/parts-requests', label: 'Parts requests', action: 'parts.request' },
  { href: '/inspections', label: 'Inspections', action: 'inspections.write' },
  { href: '/jobs', label: 'Job cards', action: 'shop.view' },
  { href: '/field-check', label: 'Field check', action: 'fleet.view' },
  { href: '/before-season', label: 'Season parts', action: 'season.list' },
  { href: '/classroom', label: 'Classroom', action: 'decks.use' },
  { href: '/admin/catalog', label: 'Catalog', action: 'catalog.read' },
  { href: '/admin/prices', label: 'Price list', action: 'prices.read' },
  { href: '/admin/stock', label: 'Dealer stock', action: 'stock.write' },
  { href: '/admin/mailbox', label: 'Mailbox', action: 'mailbox.read' },
  { href: '/admin/backup', label: 'Backup', action: 'backup.run' },
];

export const navFor = (role: Role): NavItem[] => NAV.filter((item) => !item.action || can(role, item.action));

/** Role names as people read them (kept beside the permission table). */
export { ROLE_LABEL } from '~/lib/server/access';
