import { cleanup, render, screen, within } from '@testing-library/react';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, describe, expect, it } from 'vitest';
import { PublicationRequestsTable } from '../../frontend/src/features/review/components/publication-requests-table';
import { ReviewQueueTable } from '../../frontend/src/features/review/components/review-queue-table';
import type { DatasetQueueItem, PublicationQueueItem } from '../../shared/privacy';

afterEach(cleanup);

const request: PublicationQueueItem = {
  kind: 'publication',
  id: '3f2a9c1e-8b7d-4e6f-9a0b-1c2d3e4f5a6b',
  datasetId: 'a1b2c3d4-0000-4000-8000-000000000001',
  datasetName: 'Quillfern Q3 (invented)',
  requestedBy: 'analyst@quillfern.example',
  requestedAt: '2026-11-03T10:15:00.000Z',
  note: 'Weekend shifts lead; please check the night crews',
  policyVersion: 4,
  needsReview: false,
};

const dataset: DatasetQueueItem = {
  kind: 'dataset',
  id: 'a1b2c3d4-0000-4000-8000-000000000002',
  name: 'Quillfern Q4 (invented)',
  rowCount: 2400,
  uploadedBy: 'analyst@quillfern.example',
  mappedAt: '2026-11-02T09:00:00.000Z',
  state: 'awaiting-review',
  reasons: ['No privacy officer has reviewed this dataset yet.'],
};

describe('the publication requests in the review queue', () => {
  it('shows who asked, when, their note and the policy version, linking to the run page', () => {
    render(
      <MemoryRouter>
        <PublicationRequestsTable items={[request]} hrefOf={(item) => `/models/${item.id}`} />
      </MemoryRouter>,
    );
    const link = screen.getByRole('link', { name: 'Model run on Quillfern Q3 (invented)' });
    expect(link.getAttribute('href')).toBe(`/models/${request.id}`);
    const row = link.closest('tr')!;
    expect(within(row).getByText('run 3f2a9c1e')).toBeTruthy();
    expect(within(row).getByText('analyst@quillfern.example')).toBeTruthy();
    expect(within(row).getByText('3 Nov 2026', { exact: false })).toBeTruthy();
    expect(within(row).getByText('“Weekend shifts lead; please check the night crews”')).toBeTruthy();
    expect(within(row).getByText('Version 4')).toBeTruthy();
    expect(within(row).queryByText(/policy has changed since/)).toBeNull();
  });

  it('says when a request was trained under an older policy, and when a request has no note', () => {
    render(
      <MemoryRouter>
        <PublicationRequestsTable
          items={[{ ...request, note: null, needsReview: true }]}
          hrefOf={(item) => `/models/${item.id}`}
        />
      </MemoryRouter>,
    );
    expect(screen.getByText('No note')).toBeTruthy();
    expect(screen.getByText(/policy has changed since: send it back/)).toBeTruthy();
  });

  it('says in words that no run waits, and so does an empty dataset list', () => {
    render(
      <MemoryRouter>
        <PublicationRequestsTable items={[]} hrefOf={() => '/'} />
        <ReviewQueueTable items={[]} hrefOf={() => '/'} />
      </MemoryRouter>,
    );
    expect(screen.getByText('No model run waits for publication.')).toBeTruthy();
    expect(screen.getByText('No dataset waits for approval.')).toBeTruthy();
  });

  it('keeps listing mapped datasets with their link to the review page', () => {
    render(
      <MemoryRouter>
        <ReviewQueueTable items={[dataset]} hrefOf={(item) => `/review/datasets/${item.id}`} />
      </MemoryRouter>,
    );
    const link = screen.getByRole('link', { name: 'Quillfern Q4 (invented)' });
    expect(link.getAttribute('href')).toBe(`/review/datasets/${dataset.id}`);
    expect(screen.getByText('2,400')).toBeTruthy();
  });
});
