import { cleanup, render } from '@testing-library/react';
import axe from 'axe-core';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, describe, expect, it } from 'vitest';
import { AppShell } from '../../frontend/src/components/layout/app-shell';
import { StatFigure } from '../../frontend/src/components/stat-figure';
import { TreeDiagram } from '../../frontend/src/components/tree/tree-diagram';
import { RoleOverview } from '../../frontend/src/features/home/components/role-overview';

afterEach(cleanup);

async function violations(container: HTMLElement): Promise<string[]> {
  // Colour contrast needs real layout, which happy-dom does not do; the palette was checked by hand.
  const result = await axe.run(container, { rules: { 'color-contrast': { enabled: false } } });
  return result.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

describe('accessibility of the shared pieces', () => {
  it('the shell with the home page has no axe violations', async () => {
    const { container } = render(
      <MemoryRouter>
        <AppShell
          me={{
            id: 'l1',
            email: 'lead@quillfern.example',
            name: 'Lee Lead',
            roles: ['analyst', 'privacy_officer', 'manager'],
          }}
          onSignOut={() => {}}
        >
          <h1>Welcome</h1>
          <RoleOverview roles={['analyst', 'privacy_officer', 'manager']} />
          <StatFigure label="Leavers" value={{ withheld: true }} />
        </AppShell>
      </MemoryRouter>,
    );
    expect(await violations(container)).toEqual([]);
  });

  it('the tree diagram has no axe violations', async () => {
    const { container } = render(
      <TreeDiagram
        label="Tree of model run 1"
        tree={{
          n: 40,
          positive: 8,
          split: { feature: 'Region', kind: 'categorical', categories: ['North'], missingGoesLeft: true },
          children: [{ n: 36, positive: 7 }, { withheld: true }],
        }}
      />,
    );
    expect(await violations(container)).toEqual([]);
  });
});
