import type { Permission } from '@counterpoise/api';
import type { AppIconName } from '../icons/app-icons';

/** One entry of the main navigation. */
export interface NavigationItem {
  /** The visible label. */
  readonly label: string;
  /** Its icon (one of app-icons.ts). */
  readonly icon: AppIconName;
  /** A route inside the app, or an address served by the server beside it. */
  readonly link: string;
  /** True when the address is served by the server (the docs site, the API reference), not by the router. */
  readonly external?: boolean;
  /** Shown only to signed-in people whose role holds this permission; without it, shown to everyone. */
  readonly permission?: Permission;
}

/** The main navigation, in the order of a technician's day. */
export const NAVIGATION: readonly NavigationItem[] = [
  { label: 'Home', icon: 'home', link: '/' },
  { label: 'Jobs', icon: 'assignment', link: '/jobs', permission: 'jobs:read' },
  { label: 'Safety', icon: 'health_and_safety', link: '/safety' },
  { label: 'Customers', icon: 'storefront', link: '/customers', permission: 'records:read' },
  { label: 'Machines', icon: 'agriculture', link: '/machines', permission: 'records:read' },
  { label: 'Machine families', icon: 'category', link: '/machine-families', permission: 'records:read' },
  { label: 'Widgets', icon: 'widgets', link: '/widgets' },
  { label: 'People', icon: 'group', link: '/people', permission: 'people:read' },
  { label: 'API keys', icon: 'key', link: '/keys', permission: 'keys:manage' },
  { label: 'Outbox', icon: 'outbox', link: '/outbox', permission: 'outbox:read' },
  { label: 'Docs and guides', icon: 'menu_book', link: '/docs/', external: true },
  { label: 'API reference', icon: 'api', link: '/api/docs', external: true },
];

/** The entries a person with these permissions sees. */
export function visibleNavigation(
  can: (permission: Permission) => boolean,
  items: readonly NavigationItem[] = NAVIGATION,
): NavigationItem[] {
  return items.filter((item) => item.permission === undefined || can(item.permission));
}
