import { cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { AppShell } from '../../frontend/src/components/layout/app-shell';
import type { NavItem } from '../../frontend/src/config/nav-items';
import type { Me } from '../../shared/roles';

afterEach(cleanup);

const items: NavItem[] = [
  { href: '/', label: 'Home', roles: ['analyst', 'privacy_officer', 'manager'], end: true },
  { href: '/datasets', label: 'Datasets', roles: ['analyst', 'privacy_officer'] },
  { href: '/policy', label: 'Privacy policy', roles: ['privacy_officer'] },
  { href: '/teams', label: 'My teams', roles: ['manager'] },
];

function renderShell(me: Me, onSignOut = () => {}) {
  return render(
    <MemoryRouter initialEntries={['/']}>
      <AppShell me={me} items={items} onSignOut={onSignOut}>
        <p>page content</p>
      </AppShell>
    </MemoryRouter>,
  );
}

function navLabels(): string[] {
  const nav = screen.getByRole('navigation', { name: 'Main' });
  return within(nav)
    .getAllByRole('link')
    .map((link) => link.textContent ?? '');
}

describe('the app shell', () => {
  it('shows a manager only the links meant for managers', () => {
    renderShell({
      id: 'u1',
      email: 'manager.north@quillfern.example',
      name: 'Nia North',
      roles: ['manager'],
    });
    expect(navLabels()).toEqual(['Home', 'My teams']);
  });

  it('shows a user with two roles the links of both, once each', () => {
    renderShell({
      id: 'u2',
      email: 'lead@quillfern.example',
      name: 'Lee Lead',
      roles: ['analyst', 'privacy_officer'],
    });
    expect(navLabels()).toEqual(['Home', 'Datasets', 'Privacy policy']);
  });

  it('names the signed-in user and their roles, and marks the current page', () => {
    renderShell({
      id: 'u3',
      email: 'privacy@quillfern.example',
      name: 'Pat Privacy',
      roles: ['privacy_officer'],
    });
    expect(screen.getByText('Pat Privacy')).toBeTruthy();
    expect(screen.getByTestId('user-roles').textContent).toBe('Privacy officer');
    expect(screen.getByRole('link', { name: 'Home' }).getAttribute('aria-current')).toBe('page');
    expect(screen.getByText('page content')).toBeTruthy();
  });

  it('signs out when the user asks to', () => {
    const onSignOut = vi.fn();
    renderShell(
      { id: 'u4', email: 'analyst@quillfern.example', name: 'Ana Analyst', roles: ['analyst'] },
      onSignOut,
    );
    fireEvent.click(screen.getByRole('button', { name: 'Sign out' }));
    expect(onSignOut).toHaveBeenCalledOnce();
  });
});
