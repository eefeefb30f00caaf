import { act, cleanup, fireEvent, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { DriversPanel } from '../../../frontend/src/features/models/components/drivers-panel';
import { RunForm } from '../../../frontend/src/features/models/components/run-form';
import { atRocPoint } from '../../../frontend/src/features/models/components/run-metrics';
import type { FeatureOptions } from '../../../shared/models';

afterEach(cleanup);

const datasetId = '6f1c2b9e-1d2a-4c3b-9e8f-0a1b2c3d4e5f';
const options: FeatureOptions = {
  datasetId,
  k: 5,
  policyVersion: 2,
  features: [
    { name: 'Weekly Overtime Hours', kind: 'numeric', blocked: null },
    { name: 'Years Since Qualification', kind: 'numeric', blocked: null },
    { name: 'Age (years)', kind: 'numeric', blocked: 'derived from the blocked field "Date of Birth"' },
  ],
};

describe('the run form', () => {
  it('locks blocked fields with the reason, marks proxies and says minLeaf never goes below k', async () => {
    const onSubmit = vi.fn(async () => {});
    render(
      <RunForm
        datasets={[
          {
            id: datasetId,
            name: 'Quillfern (invented)',
            status: 'mapped',
            rowCount: 300,
            uploadedBy: 'a',
            uploadedAt: '',
          },
        ]}
        featureOptions={options}
        proxies={{ 'Years Since Qualification': "Proxy of Date of Birth (Cramér's V 0.71)" }}
        initialDatasetId={datasetId}
        onDatasetChange={() => {}}
        onSubmit={onSubmit}
      />,
    );
    expect(screen.getByText('Never below k = 5: a smaller value is raised to it.')).toBeTruthy();
    const age = screen.getByLabelText(/Age \(years\) \(locked\)/) as HTMLInputElement;
    expect(age.disabled).toBe(true);
    expect(age.checked).toBe(false);
    expect(screen.getByText(/Blocked: derived from the blocked field "Date of Birth"/)).toBeTruthy();
    expect(screen.getByText(/Proxy of Date of Birth/)).toBeTruthy();
    fireEvent.change(screen.getByLabelText('Dataset'), { target: { value: datasetId } });
    await act(async () => {
      fireEvent.click(screen.getByRole('button', { name: 'Start the run' }));
    });
    expect(onSubmit).toHaveBeenCalledWith(
      expect.objectContaining({
        datasetId,
        criterion: 'gini',
        minLeaf: 25,
        features: ['Weekly Overtime Hours', 'Years Since Qualification'],
      }),
    );
  });
});

describe('the movable threshold', () => {
  it('turns a ROC point into recall, precision and counts, withholding cells under k', () => {
    // 20 leavers, 80 stayers; the point flags 15 leavers and 4 stayers
    const at = atRocPoint({ threshold: 0.4, truePositiveRate: 0.75, falsePositiveRate: 0.05 }, 20, 80, 5);
    expect(at.recall).toBe(0.75);
    expect(at.precision).toBeCloseTo(15 / 19, 12);
    expect(at.cells).toEqual({
      truePositive: 15,
      falseNegative: 5,
      falsePositive: { withheld: true },
      trueNegative: 76,
    });
  });
});

describe('the drivers panel', () => {
  it('saves the suggested action typed for a driver', async () => {
    const onSave = vi.fn(async () => {});
    render(
      <DriversPanel
        editable
        onSave={onSave}
        drivers={[
          {
            feature: 'Weekly Overtime Hours',
            importance: 0.4,
            direction: 'Higher values raise the leaver share: above 10.5.',
            trend: 'raises',
            suggestedAction: '',
          },
        ]}
      />,
    );
    fireEvent.change(screen.getByLabelText('Suggested action for managers (Weekly Overtime Hours)'), {
      target: { value: 'Review overtime allocation on van routes' },
    });
    await act(async () => {
      fireEvent.click(screen.getByRole('button', { name: 'Save action' }));
    });
    expect(onSave).toHaveBeenCalledWith('Weekly Overtime Hours', 'Review overtime allocation on van routes');
    expect(screen.getByRole('status').textContent).toBe('Saved');
  });
});
