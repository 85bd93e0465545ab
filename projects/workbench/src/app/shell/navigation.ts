/** One entry of the main navigation. */
export interface NavigationItem {
  /** The visible label. */
  readonly label: string;
  /** The Material Symbols ligature of its icon. */
  readonly icon: string;
  /** A route inside the app, or an address served by the server beside it. */
  readonly link: string;
  /** True when the address is served by the server (the API reference), not by the app's router. */
  readonly external?: boolean;
}

/** The main navigation, in the order of a technician's day. */
export const NAVIGATION: readonly NavigationItem[] = [
  { label: 'Home', icon: 'home', link: '/' },
  { label: 'Safety', icon: 'health_and_safety', link: '/safety' },
  { label: 'API reference', icon: 'api', link: '/api/docs', external: true },
];
