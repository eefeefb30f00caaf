import { cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { segmentRule } from '../../frontend/src/components/tree/segment-rule';
import { TreeDiagram } from '../../frontend/src/components/tree/tree-diagram';
import { WITHHELD_TEXT } from '../../frontend/src/components/withheld';
import type { TreeNode } from '../../shared/tree';

afterEach(cleanup);

// Invented figures in the shape of the tree JSON of API.md.
const tree: TreeNode = {
  n: 400,
  positive: 60,
  split: { feature: 'Weekly Overtime Hours', kind: 'numeric', threshold: 10.5, missingGoesLeft: true },
  children: [
    { n: 250, positive: 20 },
    {
      n: 150,
      positive: 40,
      split: {
        feature: 'Region',
        kind: 'categorical',
        categories: ['North', 'East'],
        missingGoesLeft: false,
      },
      children: [{ n: 146, positive: 39 }, { withheld: true }],
    },
  ],
};

function node(id: string): HTMLElement {
  const found = document.querySelector(`[data-node-id="${id}"]`);
  if (!found) throw new Error(`no node ${id}`);
  return found as HTMLElement;
}

describe('TreeDiagram', () => {
  it('draws a withheld node hatched, with the withheld words and no figures', () => {
    render(<TreeDiagram tree={tree} label="Tree of model run 1" />);
    const withheld = node('RR');
    expect(withheld.getAttribute('data-withheld')).toBe('true');
    expect(withheld.querySelector('circle')?.getAttribute('fill')).toMatch(/^url\(#.+-hatch\)$/);
    expect(withheld.textContent).toContain('withheld:');
    expect(withheld.textContent).toContain('fewer than k employees');
    expect(withheld.textContent).not.toMatch(/\d/);
    expect(withheld.getAttribute('aria-label')).toContain(WITHHELD_TEXT);
    expect(node('RL').getAttribute('data-withheld')).toBeNull();
  });

  it('shows the segment rule with employees and leaver share when a node is clicked', () => {
    const onSelect = vi.fn();
    render(<TreeDiagram tree={tree} label="Tree of model run 1" onSelect={onSelect} />);

    fireEvent.click(node('RL'));

    const detail = screen.getByTestId('segment-detail');
    expect(
      within(detail).getByText('Weekly Overtime Hours above 10.5 and Region is North or East'),
    ).toBeTruthy();
    expect(within(detail).getByText('146')).toBeTruthy();
    expect(within(detail).getByText('26.7%')).toBeTruthy();
    expect(onSelect).toHaveBeenCalledWith(expect.objectContaining({ id: 'RL' }));
  });

  it('lets keyboard users reach a node and open it with Enter', () => {
    render(<TreeDiagram tree={tree} label="Tree of model run 1" />);
    const leaf = node('L');
    expect(leaf.getAttribute('tabindex')).toBe('0');
    expect(leaf.getAttribute('role')).toBe('button');

    fireEvent.keyDown(leaf, { key: 'Enter' });

    expect(leaf.getAttribute('aria-pressed')).toBe('true');
    expect(
      within(screen.getByTestId('segment-detail')).getByText(
        'Weekly Overtime Hours at most 10.5 (or missing)',
      ),
    ).toBeTruthy();
  });

  it('shows a withheld segment by its rule only', () => {
    render(<TreeDiagram tree={tree} label="Tree of model run 1" />);
    fireEvent.click(node('RR'));
    const detail = screen.getByTestId('segment-detail');
    expect(
      within(detail).getByText(
        'Weekly Overtime Hours above 10.5 and Region is neither North nor East (or missing)',
      ),
    ).toBeTruthy();
    expect(within(detail).getByText(WITHHELD_TEXT)).toBeTruthy();
    expect(within(detail).queryByText('Employees')).toBeNull();
  });

  it('takes the rule wording from the caller when given', () => {
    render(
      <TreeDiagram
        tree={tree}
        label="Tree of model run 1"
        describeRule={(steps) => `${steps.length} conditions`}
      />,
    );
    fireEvent.click(node('RL'));
    expect(within(screen.getByTestId('segment-detail')).getByText('2 conditions')).toBeTruthy();
  });
});

describe('segmentRule', () => {
  it('merges repeated numeric splits on one feature into one clause', () => {
    const tenure = (threshold: number) =>
      ({ feature: 'Tenure', kind: 'numeric', threshold, missingGoesLeft: false }) as const;
    expect(
      segmentRule([
        { split: tenure(5), side: 'left' },
        { split: tenure(2), side: 'right' },
      ]),
    ).toBe('Tenure above 2 and at most 5');
  });

  it('describes the root as all employees', () => {
    expect(segmentRule([])).toBe('All employees');
  });
});
