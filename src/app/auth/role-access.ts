import type { Role } from '../../../shared/api/auth.js';

/** The top-level areas of the app, one lazy-loaded route each. */
export type AreaPath = 'matches' | 'stock' | 'builds' | 'shortfall' | 'admin' | 'outbox' | 'settings';

/** One area: where it lives, how the navigation names it, and which roles may open it. */
export interface Area {
  /** Route path under the shell, without a slash. */
  readonly path: AreaPath;
  /** Navigation label. */
  readonly label: string;
  /** Material Symbols ligature for the navigation. */
  readonly icon: string;
  /** Roles that may open the area (product.md: every role reads stock and matches). */
  readonly roles: readonly Role[];
}

const EVERY_ROLE: readonly Role[] = ['designer', 'stores', 'purchasing', 'admin'];

/** Every area in navigation order, with the roles that may open it. */
export const AREAS: readonly Area[] = [
  { path: 'matches', label: 'Matches', icon: 'cable', roles: EVERY_ROLE },
  { path: 'stock', label: 'Stock', icon: 'inventory_2', roles: EVERY_ROLE },
  { path: 'builds', label: 'Builds', icon: 'developer_board', roles: EVERY_ROLE },
  { path: 'shortfall', label: 'Shortfall lists', icon: 'receipt_long', roles: ['purchasing', 'designer', 'admin'] },
  { path: 'admin', label: 'Admin', icon: 'admin_panel_settings', roles: ['admin'] },
  { path: 'outbox', label: 'Outbox', icon: 'outbox', roles: ['admin'] },
  { path: 'settings', label: 'Organisation settings', icon: 'tune', roles: ['admin'] },
];

/** The area each role lands on after sign-in: the one its daily work starts from. */
const HOME_AREA: Readonly<Record<Role, AreaPath>> = {
  designer: 'matches',
  stores: 'stock',
  purchasing: 'shortfall',
  admin: 'admin',
};

/** The areas `role` may open, in navigation order. */
export function areasFor(role: Role): Area[] {
  return AREAS.filter((area) => area.roles.includes(role));
}

/** Whether `role` may open the area at `path`. */
export function mayEnter(role: Role, path: AreaPath): boolean {
  return AREAS.some((area) => area.path === path && area.roles.includes(role));
}

/** The absolute URL of the page `role` lands on after sign-in, e.g. `/matches` for a designer. */
export function homeUrlFor(role: Role): string {
  return `/${HOME_AREA[role]}`;
}

/**
 * Whether `url` is a safe in-app address `role` may return to after signing in: it must start
 * with one slash (no `//host` or `http:` escape) and name an area the role may open.
 */
export function mayReturnTo(role: Role, url: string | undefined | null): url is string {
  if (!url || !url.startsWith('/') || url.startsWith('//')) return false;
  const first = url.slice(1).split(/[/?#;]/, 1)[0];
  return AREAS.some((area) => area.path === first && area.roles.includes(role));
}
