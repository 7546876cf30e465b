import type { Ability } from '@shared/roles.ts';
import { paths } from './paths.ts';

export interface NavItem {
  label: string;
  href: string;
  /** Shown only to actors with this ability (from /api/me). */
  needs?: Ability;
}

export const NAV: NavItem[] = [
  { label: 'Home', href: paths.home.href() },
  { label: 'Catalogue', href: paths.catalogue.href(), needs: 'catalogue.view' },
  { label: 'Stack planner', href: paths.planner.href(), needs: 'plans.create' },
  { label: 'Saved plans', href: paths.plans.href(), needs: 'plans.create' },
  { label: 'Users', href: paths.users.href(), needs: 'users.manage' },
];
