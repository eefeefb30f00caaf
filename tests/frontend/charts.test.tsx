import { cleanup, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { CalibrationChart } from '../../frontend/src/components/charts/calibration-chart';
import { niceTop, shareTicks } from '../../frontend/src/components/charts/chart-frame';
import { GainsChart } from '../../frontend/src/components/charts/gains-chart';
import { ImportanceBars } from '../../frontend/src/components/charts/importance-bars';
import { RateComparison } from '../../frontend/src/components/charts/rate-comparison';
import { RiskBands } from '../../frontend/src/components/charts/risk-bands';
import { RocCurve } from '../../frontend/src/components/charts/roc-curve';
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

  it('labels its axis in round percentages, not quarters of the top', () => {
    // 27.8% at most: the axis runs to 35%, ticked every 10 points rather than at 9%, 18%, 27%.
    expect(shareTicks(niceTop([0.278, 0.222, 0.148]))).toEqual([0, 0.1, 0.2, 0.3]);
    expect(shareTicks(0.15)).toEqual([0, 0.05, 0.1, 0.15]);
  });
});

describe('model run charts', () => {
  it('draw the ROC curve with its AUC in the title', () => {
    const { container } = render(
      <RocCurve
        width={400}
        auc={0.75}
        points={[
          { fpr: 0, tpr: 0 },
          { fpr: 0, tpr: 0.5 },
          { fpr: 0.5, tpr: 0.5 },
          { fpr: 0.5, tpr: 1 },
          { fpr: 1, tpr: 1 },
        ]}
      />,
    );
    expect(screen.getByText('ROC curve (AUC 0.750)')).toBeTruthy();
    expect(container.querySelector('.recharts-line-curve')).not.toBeNull();
  });

  it('describe calibration, gains and importance in words as well as drawings', () => {
    render(
      <>
        <CalibrationChart width={400} deciles={[{ decile: 1, predicted: 0.02, observed: 0.03 }]} />
        <GainsChart width={400} points={[{ decile: 1, cumulativeGain: 0.31 }]} />
        <ImportanceBars
          width={400}
          items={[
            { feature: 'Weekly Overtime Hours', importance: 3, direction: 'raises' },
            { feature: 'Training Days', importance: 1, direction: 'lowers' },
          ]}
        />
      </>,
    );
    expect(screen.getByText('Decile 1: predicted 2.0%, observed 3.0%')).toBeTruthy();
    expect(screen.getByText('Top 10% of employees by predicted risk hold 31.0% of leavers')).toBeTruthy();
    expect(
      screen.getByText('Weekly Overtime Hours: 75% of the importance shown, raises the leaver share'),
    ).toBeTruthy();
  });
});
