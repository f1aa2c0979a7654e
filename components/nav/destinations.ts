import type { Href } from 'expo-router';
import { ROLES, type Role } from '@/shared/roles';
import type { IconName } from '@/components/ui/button';

export interface Destination {
  /** Also forms the testID: `nav-<key>`. */
  key: string;
  label: string;
  href: Href & string;
  icon: IconName;
  activeIcon: IconName;
  /** Who sees it in the navigation. The screen itself still explains itself to anyone else. */
  roles: readonly Role[];
}

/**
 * Every place in the lab area, in navigation order. Adding a screen to the navigation is one
 * entry here; the bottom bar, rail and side column all read this list.
 */
export const DESTINATIONS: readonly Destination[] = [
  { key: 'bench', label: 'Bench', href: '/bench', icon: 'flask-outline', activeIcon: 'flask', roles: ROLES },
  { key: 'samples', label: 'Samples', href: '/samples', icon: 'layers-outline', activeIcon: 'layers', roles: ROLES },
  { key: 'scan', label: 'Scan', href: '/scan', icon: 'scan-outline', activeIcon: 'scan', roles: ROLES },
  { key: 'boxes', label: 'Boxes', href: '/boxes', icon: 'grid-outline', activeIcon: 'grid', roles: ROLES },
  {
    key: 'people',
    label: 'People',
    href: '/people',
    icon: 'people-outline',
    activeIcon: 'people',
    roles: ['manager'],
  },
  {
    key: 'outbox',
    label: 'Outbox',
    href: '/outbox',
    icon: 'mail-outline',
    activeIcon: 'mail',
    roles: ['manager'],
  },
  {
    key: 'account',
    label: 'Account',
    href: '/account',
    icon: 'person-circle-outline',
    activeIcon: 'person-circle',
    roles: ROLES,
  },
];

export function destinationsFor(role: Role): Destination[] {
  return DESTINATIONS.filter((destination) => destination.roles.includes(role));
}

/** A destination is current on its own path and on any path beneath it. */
export function isCurrent(destination: Destination, pathname: string): boolean {
  return pathname === destination.href || pathname.startsWith(`${destination.href}/`);
}
