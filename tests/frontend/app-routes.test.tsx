import { QueryClientProvider } from '@tanstack/react-query';
import { cleanup, render, screen } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { routes } from '../../frontend/src/app/router';
import { CAUTION_TEXT } from '../../frontend/src/components/caution';
import { makeQueryClient } from '../../frontend/src/lib/react-query';
import type { Me } from '../../shared/roles';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

function signedInAs(me: Me) {
  vi.stubGlobal(
    'fetch',
    vi.fn(
      async () =>
        new Response(JSON.stringify(me), { status: 200, headers: { 'Content-Type': 'application/json' } }),
    ),
  );
}

function openApp(path: string) {
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  render(
    <QueryClientProvider client={makeQueryClient()}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
}

describe('the app', () => {
  it('greets a manager with what managers do in Coppice, and the caution', async () => {
    signedInAs({ id: 'm1', email: 'manager.north@quillfern.example', name: 'Nia North', roles: ['manager'] });
    openApp('/');
    expect(await screen.findByRole('heading', { name: 'Welcome, Nia North' })).toBeTruthy();
    expect(screen.getByRole('heading', { name: 'Department manager' })).toBeTruthy();
    expect(screen.queryByRole('heading', { name: 'HR analyst' })).toBeNull();
    expect(screen.getByText(CAUTION_TEXT)).toBeTruthy();
  });

  it('tells a privacy officer about the privacy policy, approvals and the audit trail', async () => {
    signedInAs({
      id: 'p1',
      email: 'privacy@quillfern.example',
      name: 'Pat Privacy',
      roles: ['privacy_officer'],
    });
    openApp('/');
    expect(await screen.findByRole('heading', { name: 'Privacy officer' })).toBeTruthy();
    expect(screen.getByText(/Set the privacy policy/)).toBeTruthy();
    expect(screen.getByText(/audit trail/)).toBeTruthy();
  });

  it('says so when a page does not exist, inside the shell', async () => {
    signedInAs({ id: 'a1', email: 'analyst@quillfern.example', name: 'Ana Analyst', roles: ['analyst'] });
    openApp('/no-such-page');
    expect(await screen.findByRole('heading', { name: 'Page not found' })).toBeTruthy();
    expect(screen.getByRole('navigation', { name: 'Main' })).toBeTruthy();
  });
});
