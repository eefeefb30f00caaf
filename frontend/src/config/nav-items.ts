import type { Role } from '../../../shared/roles';
import { paths } from './paths';

export type NavItem = {
  /** the link target, from `paths` */
  href: string;
  label: string;
  /** who sees the link; the backend still enforces access */
  roles: readonly Role[];
  /** true when only an exact path match marks the link as current */
  end?: boolean;
};

/** One entry per feature screen that exists; add yours when the screen works. */
export const navItems: readonly NavItem[] = [
  { href: paths.home.href(), label: 'Home', roles: ['analyst', 'privacy_officer', 'manager'], end: true },
  { href: paths.teams.href(), label: 'My teams', roles: ['manager'] },
  { href: paths.datasets.href(), label: 'Datasets', roles: ['analyst', 'privacy_officer'] },
  { href: paths.models.href(), label: 'Model runs', roles: ['analyst', 'privacy_officer'] },
  { href: paths.privacyPolicy.href(), label: 'Privacy policy', roles: ['analyst', 'privacy_officer'] },
  { href: paths.reviewQueue.href(), label: 'Review queue', roles: ['privacy_officer'] },
  { href: paths.auditTrail.href(), label: 'Audit trail', roles: ['privacy_officer'] },
  { href: paths.teams.href(), label: 'Team briefs', roles: ['analyst', 'privacy_officer'] },
];

export function navItemsFor(roles: readonly Role[], items: readonly NavItem[] = navItems): NavItem[] {
  return items.filter((item) => item.roles.some((role) => roles.includes(role)));
}
