// What the navigation offers, and to which roles. The server enforces the same rules.
import type { Role } from '@shared/domain';

export interface NavItem {
  label: string;
  name: string; // route name
  roles: Role[] | 'any';
  icon: string; // key in components/AppIcon.vue
}

/** Top-level places. */
export const mainNav: NavItem[] = [
  { label: 'Builds', name: 'builds', roles: 'any', icon: 'garage' },
  { label: 'Users & roles', name: 'users', roles: ['owner'], icon: 'people' },
  { label: 'My account', name: 'account', roles: 'any', icon: 'person' },
];

/** Places inside one build (route names take the :buildId param). */
export const buildNav: NavItem[] = [
  { label: 'Overview', name: 'overview', roles: ['producer'], icon: 'chart' },
  { label: 'Backlog', name: 'backlog', roles: 'any', icon: 'list' },
  { label: 'Parts', name: 'parts', roles: 'any', icon: 'box' },
  { label: 'Media', name: 'media', roles: 'any', icon: 'image' },
  { label: 'Planner', name: 'planner', roles: ['producer'], icon: 'film' },
  { label: 'Shop floor', name: 'shop-floor', roles: ['installer', 'producer'], icon: 'wrench' },
  { label: 'Publish', name: 'publish', roles: ['marketing', 'producer'], icon: 'megaphone' },
  { label: 'Sales', name: 'sales', roles: ['marketing', 'producer'], icon: 'chart' },
  { label: 'Viewer requests', name: 'viewer-requests', roles: ['marketing', 'producer'], icon: 'inbox' },
  { label: 'Settings', name: 'build-settings', roles: ['producer'], icon: 'settings' },
];

export function allowed(item: NavItem, can: (...r: Role[]) => boolean) {
  return item.roles === 'any' || can(...item.roles);
}
