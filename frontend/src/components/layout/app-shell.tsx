import type { ReactNode } from 'react';
import { NavLink } from 'react-router-dom';
import { type Me, ROLE_LABELS } from '../../../../shared/roles';
import { type NavItem, navItems, navItemsFor } from '../../config/nav-items';
import { Button } from '../button';

export type AppShellProps = {
  me: Me;
  /** defaults to the app's nav items; shown only for the roles `me` holds */
  items?: readonly NavItem[];
  onSignOut: () => void;
  children: ReactNode;
};

function CoppiceMark() {
  // A cut stool with three new shoots: the product's own mark.
  return (
    <svg viewBox="0 0 32 32" className="h-7 w-7" aria-hidden="true">
      <ellipse cx="16" cy="26" rx="9" ry="3.5" fill="#b58f52" />
      <path
        d="M16 25 V10 M11 25 C11 18 8 15 6 12 M21 25 C21 18 24 15 26 12"
        stroke="#dce6d7"
        strokeWidth="2"
        fill="none"
        strokeLinecap="round"
      />
      <circle cx="16" cy="8" r="3" fill="#8fae83" />
      <circle cx="6" cy="11" r="2.5" fill="#8fae83" />
      <circle cx="26" cy="11" r="2.5" fill="#8fae83" />
    </svg>
  );
}

export function AppShell({ me, items = navItems, onSignOut, children }: AppShellProps) {
  const visible = navItemsFor(me.roles, items);
  return (
    <div className="flex min-h-screen flex-col font-sans">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-10 focus:rounded focus:bg-white focus:px-3 focus:py-2"
      >
        Skip to content
      </a>
      <header className="print:hidden bg-moss-900 text-moss-50">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-4 px-6 py-3">
          <div className="flex items-center gap-2">
            <CoppiceMark />
            <span className="text-lg font-semibold tracking-wide">Coppice</span>
          </div>
          <div className="flex items-center gap-4">
            <div className="text-right text-sm leading-tight">
              <div className="font-medium">{me.name}</div>
              <div className="text-moss-200" data-testid="user-roles">
                {me.roles.map((role) => ROLE_LABELS[role]).join(' · ') || 'No role assigned'}
              </div>
            </div>
            <Button variant="secondary" size="sm" onClick={onSignOut}>
              Sign out
            </Button>
          </div>
        </div>
        <nav aria-label="Main" className="border-t border-moss-800 bg-moss-800/60">
          <ul className="mx-auto flex max-w-6xl flex-wrap gap-1 px-6">
            {visible.map((item) => (
              <li key={item.href}>
                <NavLink
                  to={item.href}
                  end={item.end}
                  className={({ isActive }) =>
                    `inline-block border-b-2 px-3 py-2 text-sm font-medium ${
                      isActive
                        ? 'border-sand-300 text-white'
                        : 'border-transparent text-moss-100 hover:border-moss-400 hover:text-white'
                    }`
                  }
                >
                  {item.label}
                </NavLink>
              </li>
            ))}
          </ul>
        </nav>
      </header>
      <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-6 py-8">
        {children}
      </main>
      <footer className="print:hidden border-t border-sand-200 py-4 text-center text-xs text-slate-500">
        Coppice shows groups, never individuals.
      </footer>
    </div>
  );
}
