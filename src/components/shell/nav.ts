import type { Role } from '../../db/schema';

export interface NavItem {
  href: string;
  label: string;
  roles: readonly Role[];
}

/** The app's sections and who sees them. Each page still checks the role on the server. */
export const NAV: NavItem[] = [
  { href: '/', label: 'Home', roles: ['operator', 'technician', 'trainer', 'dealer_admin', 'instance_admin'] },
  { href: '/machines', label: 'Machines', roles: ['operator', 'technician', 'trainer', 'dealer_admin'] },
  { href: '/planner', label: 'Crop change', roles: ['operator', 'technician'] },
  { href: '/parts-requests', label: 'Parts requests', roles: ['operator', 'technician', 'dealer_admin'] },
  { href: '/inspections', label: 'Inspections', roles: ['operator', 'technician'] },
  { href: '/field-check', label: 'Field check', roles: ['operator', 'technician', 'trainer', 'dealer_admin'] },
  { href: '/classroom', label: 'Classroom', roles: ['trainer', 'technician'] },
  { href: '/admin/catalog', label: 'Catalog', roles: ['instance_admin', 'dealer_admin', 'technician'] },
  { href: '/admin/prices', label: 'Price list', roles: ['dealer_admin', 'technician'] },
  { href: '/admin/mailbox', label: 'Mailbox', roles: ['dealer_admin', 'instance_admin'] },
  { href: '/admin/backup', label: 'Backup', roles: ['instance_admin'] },
];

export const navFor = (role: Role) => NAV.filter((item) => item.roles.includes(role));

export const ROLE_LABEL: Record<Role, string> = {
  operator: 'Operator',
  technician: 'Service technician',
  trainer: 'Trainer',
  dealer_admin: 'Dealer administrator',
  instance_admin: 'Instance administrator',
};
