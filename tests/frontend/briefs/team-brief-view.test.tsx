import { cleanup, render, screen, within } from '@testing-library/react';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, describe, expect, it } from 'vitest';
import { CAUTION_TEXT } from '../../../frontend/src/components/caution';
import { WITHHELD_TEXT } from '../../../frontend/src/components/withheld';
import { TeamBriefView } from '../../../frontend/src/features/briefs/components/team-brief-view';
import { TeamCards } from '../../../frontend/src/features/briefs/components/team-cards';
import { BRIEF_CAUTION, type TeamBrief, type WithheldTeamBrief } from '../../../shared/briefs';

afterEach(cleanup);

const W = { withheld: true } as const;

const brief: TeamBrief = {
  withheld: false,
  team: { id: 't1', name: 'Alderbrook Crew 1', department: 'Alderbrook' },
  k: 5,
  window: { start: '2025-10-01', end: '2026-09-30' },
  publishedAt: '2026-10-15T09:00:00.000Z',
  figures: {
    team: { headcount: 18, leavers: W, attritionRate: W },
    department: { name: 'Alderbrook', headcount: 89, leavers: 13, attritionRate: 13 / 89 },
    organisation: { headcount: 596, leavers: 75, attritionRate: 75 / 596 },
  },
  expectedLeaverShare: { team: 14, organisation: 13 },
  riskBands: {
    rule: 'Employees are put into bands by the model’s expected leaver share of their segment.',
    bands: [
      { band: 'low', employees: 6 },
      { band: 'medium', employees: W },
      { band: 'high', employees: W },
    ],
  },
  drivers: [
    {
      feature: 'Weekly Overtime Hours',
      direction: 'raises',
      points: 6,
      sentence:
        'Weekly Overtime Hours raises the expected leaver share of this team by about 6 points over the organisation.',
      suggestedAction: 'Review rotas so overtime is shared out.',
    },
    {
      feature: 'Training Days',
      direction: 'lowers',
      points: 1,
      sentence:
        'Training Days lowers the expected leaver share of this team by about 1 point below the organisation.',
      suggestedAction: null,
    },
  ],
  segments: [{ id: 'LR', rule: 'Weekend Shifts per Month above 5.5', employees: 7, leaverShare: 21 }],
  caution: BRIEF_CAUTION,
};

describe('the team brief page', () => {
  it('shows the headline figures, drivers with direction, size and suggested action, segments and the caution', () => {
    render(<TeamBriefView brief={brief} />);
    expect(screen.getByText('18')).toBeTruthy();
    expect(screen.getByText(CAUTION_TEXT)).toBeTruthy();
    const cards = screen.getAllByTestId('driver-card');
    expect(cards).toHaveLength(2);
    expect(within(cards[0]!).getByText('raises · about 6 points')).toBeTruthy();
    expect(within(cards[0]!).getByText('Review rotas so overtime is shared out.')).toBeTruthy();
    expect(within(cards[1]!).getByText('lowers · about 1 point')).toBeTruthy();
    expect(screen.getByText('Weekend Shifts per Month above 5.5')).toBeTruthy();
    expect(screen.getByText('21%')).toBeTruthy();
  });

  it('draws withheld figures hatched with the words, never a number', () => {
    const { container } = render(<TeamBriefView brief={brief} />);
    expect(screen.getAllByText(WITHHELD_TEXT).length).toBeGreaterThanOrEqual(2);
    expect(container.querySelectorAll('[data-withheld="true"]').length).toBeGreaterThanOrEqual(2);
  });

  it('gives a team of fewer than k employees only the statement and the caution', () => {
    const withheld: WithheldTeamBrief = {
      withheld: true,
      team: { id: 't2', name: 'Harrowfield Night Crew', department: 'Harrowfield' },
      k: 5,
      publishedAt: brief.publishedAt,
      message: 'withheld: fewer than 5 employees.',
      caution: BRIEF_CAUTION,
    };
    const { container } = render(<TeamBriefView brief={withheld} />);
    expect(screen.getByText(/has fewer than 5 employees, so it has no brief/)).toBeTruthy();
    expect(screen.getByText(CAUTION_TEXT)).toBeTruthy();
    expect(container.querySelectorAll('[data-testid="driver-card"]')).toHaveLength(0);
  });
});

describe('My teams', () => {
  it('shows each team as a card, a withheld team hatched with no figures', () => {
    render(
      <MemoryRouter>
        <TeamCards
          hrefOf={(t) => `/teams/${t.id}`}
          teams={[
            {
              id: 'a',
              name: 'Alderbrook Crew 1',
              department: 'Alderbrook',
              headcount: 18,
              withheld: false,
              attritionRate: 0.125,
              organisationRate: 0.1,
              publishedAt: brief.publishedAt,
            },
            {
              id: 'b',
              name: 'Harrowfield Night Crew',
              department: 'Harrowfield',
              headcount: null,
              withheld: true,
              publishedAt: brief.publishedAt,
            },
          ]}
        />
      </MemoryRouter>,
    );
    const cards = screen.getAllByRole('listitem');
    expect(within(cards[0]!).getByText('12.5%')).toBeTruthy();
    expect(within(cards[0]!).getByText('10.0%')).toBeTruthy();
    expect(within(cards[1]!).getByText(WITHHELD_TEXT)).toBeTruthy();
    expect(cards[1]!.textContent).not.toMatch(/\d/);
    expect(within(cards[1]!).getByRole('link').getAttribute('href')).toBe('/teams/b');
  });
});
