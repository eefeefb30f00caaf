import { act, cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { auditExportHref } from '../../frontend/src/features/audit/api/export-audit';
import { AuditTable } from '../../frontend/src/features/audit/components/audit-table';
import { PolicyForm } from '../../frontend/src/features/policy/components/policy-form';
import { ApiError } from '../../frontend/src/lib/api-client';
import type { Policy } from '../../shared/policy';

afterEach(cleanup);

const policy: Policy = {
  version: 3,
  k: 5,
  blockedFields: ['Date of Birth'],
  proxyThreshold: 0.5,
  retentionDays: 365,
  reason: 'Initial agreement',
  authorEmail: 'privacy@quillfern.example',
  createdAt: '2026-11-02T09:00:00.000Z',
};

async function press(name: string | RegExp) {
  await act(async () => {
    fireEvent.click(screen.getByRole('button', { name }));
  });
}

describe('the privacy policy form', () => {
  it('explains each setting in plain words', () => {
    render(<PolicyForm policy={policy} canEdit onSubmit={async () => {}} />);
    expect(screen.getByLabelText('Minimum group size (k)')).toBeTruthy();
    expect(screen.getByText(/5 is common practice in HR reporting/)).toBeTruthy();
    expect(screen.getByText(/years since qualification can stand in for age/)).toBeTruthy();
    expect(screen.getByText(/deleted this many days after upload/)).toBeTruthy();
  });

  it('refuses a k below 2 and a missing reason beside the fields, without saving', async () => {
    const onSubmit = vi.fn(async () => {});
    render(<PolicyForm policy={policy} canEdit onSubmit={onSubmit} />);
    fireEvent.change(screen.getByLabelText('Minimum group size (k)'), { target: { value: '1' } });
    await press(/Save as version 4/);
    expect(screen.getByText('k must be at least 2')).toBeTruthy();
    expect(screen.getByText(/reason is required/)).toBeTruthy();
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it('blocks a further field, unblocks one and saves with the reason', async () => {
    const onSubmit = vi.fn(async () => {});
    render(
      <PolicyForm
        policy={policy}
        canEdit
        onSubmit={onSubmit}
        suggestions={[{ name: 'Gender', note: 'UK Equality Act 2010 s.4: sex' }]}
      />,
    );
    expect(screen.getByText('UK Equality Act 2010 s.4: sex')).toBeTruthy();
    await press('Block Gender');
    fireEvent.change(screen.getByLabelText('Column name to block'), { target: { value: 'Ethnicity' } });
    await press('Add');
    await press('Unblock Date of Birth');
    fireEvent.change(screen.getByLabelText('Reason for the change'), {
      target: { value: 'Works council, 3 March' },
    });
    fireEvent.change(screen.getByLabelText('Minimum group size (k)'), { target: { value: '8' } });
    await press(/Save as version 4/);
    expect(onSubmit).toHaveBeenCalledWith({
      k: 8,
      blockedFields: ['Gender', 'Ethnicity'],
      proxyThreshold: 0.5,
      retentionDays: 365,
      reason: 'Works council, 3 March',
    });
    const list = screen.getByRole('list', { name: 'Blocked fields' });
    expect(
      within(list)
        .getAllByRole('listitem')
        .map((li) => li.textContent?.replace('×', '')),
    ).toEqual(['Gender', 'Ethnicity']);
  });

  it('shows the server’s message beside the field it names', async () => {
    const onSubmit = vi.fn(async () => {
      throw new ApiError(400, 'invalid_body', 'The request is not valid; see details for each field.', [
        { path: 'retentionDays', message: 'retentionDays must be at most 3650' },
      ]);
    });
    render(<PolicyForm policy={policy} canEdit onSubmit={onSubmit} />);
    fireEvent.change(screen.getByLabelText('Reason for the change'), {
      target: { value: 'Longer retention' },
    });
    fireEvent.change(screen.getByLabelText('Retention (days)'), { target: { value: '900' } });
    await press(/Save as version 4/);
    expect(screen.getByText('retentionDays must be at most 3650')).toBeTruthy();
    expect(screen.getByRole('alert').textContent).toContain('The policy was not saved');
  });

  it('is read-only for someone who is not a privacy officer', () => {
    render(<PolicyForm policy={policy} canEdit={false} onSubmit={async () => {}} />);
    expect(screen.queryByRole('button', { name: /Save/ })).toBeNull();
    expect((screen.getByLabelText('Minimum group size (k)') as HTMLInputElement).disabled).toBe(true);
  });
});

describe('the audit trail', () => {
  it('names actions in plain words beside their codes', () => {
    render(
      <AuditTable
        events={[
          {
            id: '7',
            at: '2026-11-02T09:00:00.000Z',
            actorEmail: 'privacy@quillfern.example',
            action: 'policy.change',
            objectType: 'policy',
            objectId: '4',
            details: { reason: 'Works council', k: { from: 5, to: 7 }, blocked: ['Gender'], unblocked: [] },
          },
        ]}
      />,
    );
    expect(screen.getByText('Changed the privacy policy')).toBeTruthy();
    expect(screen.getByText('policy.change')).toBeTruthy();
    expect(
      screen.getByText('reason: Works council; k: 5 → 7; blocked: Gender; unblocked: none'),
    ).toBeTruthy();
  });

  it('exports exactly the filtered lines, not just the page on screen', () => {
    expect(auditExportHref({ actor: 'privacy', action: 'policy.', page: 3, pageSize: 50 })).toBe(
      '/api/audit/export.csv?actor=privacy&action=policy.',
    );
  });
});
