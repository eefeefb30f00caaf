import { cleanup, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { RateComparison } from '../../frontend/src/components/charts/rate-comparison';
import { RiskBands } from '../../frontend/src/components/charts/risk-bands';
import { WITHHELD_TEXT } from '../../frontend/src/components/withheld';

afterEach(cleanup);

describe('RiskBands', () => {
  it('draws a withheld band hatched and says so in words, without its count', () => {
    const { container } = render(
      <RiskBands
        width={480}
        bands={[
          { band: 'low', count: 31 },
          { band: 'medium', count: 12 },
          { band: 'high', count: { withheld: true } },
        ]}
      />,
    );
    expect(screen.getByText(`High risk: ${WITHHELD_TEXT}`)).toBeTruthy();
    expect(screen.getByText('Low risk: 31 employees')).toBeTruthy();
    const hatched = [...container.querySelectorAll('path, rect')].filter((el) =>
      /^url\(#.+-hatch\)$/.test(el.getAttribute('fill') ?? ''),
    );
    expect(hatched.length).toBe(1);
  });
});

describe('RateComparison', () => {
  it('puts the team beside the department and organisation rates', () => {
    render(
      <RateComparison
        width={480}
        rates={[
          { label: 'Team', rate: 0.18 },
          { label: 'Department', rate: 0.142 },
          { label: 'Organisation', rate: 0.121 },
        ]}
      />,
    );
    expect(screen.getByText('Team: 18.0%')).toBeTruthy();
    expect(screen.getByText('Organisation: 12.1%')).toBeTruthy();
  });
});
