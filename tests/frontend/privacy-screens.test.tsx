import { act, cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { WITHHELD_TEXT } from '../../frontend/src/components/withheld';
import { auditExportHref } from '../../frontend/src/features/audit/api/export-audit';
import { AuditTable } from '../../frontend/src/features/audit/components/audit-table';
import { FairnessTable } from '../../frontend/src/features/fairness/components/fairness-table';
import { PolicyForm } from '../../frontend/src/features/policy/components/policy-form';
import { ApprovalPanel } from '../../frontend/src/features/review/components/approval-panel';
import { ProxyReportTable } from '../../frontend/src/features/review/components/proxy-report-table';
import { ApiError } from '../../frontend/src/lib/api-client';
import type { Policy } from '../../shared/policy';
import type { FairnessReportView, ProxyRowView } from '../../shared/privacy';

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

  /** The policy form as a privacy officer sees it, with the intake's suggestions; its submit spy. */
  function renderPolicyForm(suggestions?: { name: string; note: string }[]) {
    const onSubmit = vi.fn(async () => {});
    render(<PolicyForm policy={policy} canEdit onSubmit={onSubmit} suggestions={suggestions} />);
    return onSubmit;
  }

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
    const onSubmit = renderPolicyForm([{ name: 'Gender', note: 'UK Equality Act 2010 s.4: sex' }]);
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

  it('blocks every suggested protected characteristic with one press, then saves them', async () => {
    const onSubmit = renderPolicyForm([
      { name: 'Date of Birth', note: 'age' },
      { name: 'Gender', note: 'sex' },
      { name: 'Religion', note: 'religion or belief' },
    ]);
    // Date of Birth is blocked already, so two suggestions remain open.
    await press('Block all 2 suggested');
    expect(screen.queryByRole('button', { name: /Block all/ })).toBeNull();
    fireEvent.change(screen.getByLabelText('Reason for the change'), {
      target: { value: 'Intake suggestions' },
    });
    await press(/Save as version 4/);
    expect(onSubmit).toHaveBeenCalledWith(
      expect.objectContaining({ blockedFields: ['Date of Birth', 'Gender', 'Religion'] }),
    );
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

const proxyRow = (feature: string, v: number, flagged: boolean): ProxyRowView => ({
  feature,
  blockedField: 'Date of Birth',
  cramersV: v,
  normalisedMutualInformation: v / 2,
  chiSquare: 100,
  dof: 16,
  n: 2400,
  featureBins: feature === 'Depot' ? null : 5,
  blockedFieldBins: 5,
  strength: v >= 0.5 ? 'large' : 'small',
  flagged,
  decision: null,
});

describe('the proxy report', () => {
  it('lists the strongest pair first, flags it and lets the privacy officer decide', async () => {
    const onDecide = vi.fn();
    render(
      <ProxyReportTable
        rows={[proxyRow('Depot', 0.12, false), proxyRow('Years Since Qualification', 0.81, true)]}
        threshold={0.5}
        bins={5}
        onDecide={onDecide}
      />,
    );
    const rows = screen.getAllByRole('row').slice(1);
    expect(rows[0]!.textContent).toContain('Years Since Qualification');
    expect(rows[0]!.textContent).toContain('Possible proxy: large');
    expect(
      screen.getByText('Years Since Qualification in 5 quantile bins; Date of Birth in 5 quantile bins'),
    ).toBeTruthy();
    expect(screen.getByRole('img', { name: "Cramér's V 0.81, at or above the threshold" })).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Block Depot' })).toBeNull();
    await press('Block Years Since Qualification');
    expect(onDecide).toHaveBeenCalledWith(
      expect.objectContaining({ feature: 'Years Since Qualification' }),
      'block',
    );
  });
});

describe('the fairness screen', () => {
  const report: FairnessReportView = {
    field: 'Disability',
    rule: 'four-fifths rule (29 CFR 1607.4(D)), applied to retention rates (1 − attrition rate)',
    bins: null,
    k: 5,
    groups: [
      {
        group: 'No',
        headcount: 40,
        leavers: 8,
        attritionRate: 0.2,
        meanPredictedRisk: 0.21,
        retentionRate: 0.8,
        retentionRatio: 1,
        reference: true,
        flagged: false,
        withheld: false,
      },
      {
        group: 'Yes',
        headcount: 30,
        leavers: 15,
        attritionRate: 0.5,
        meanPredictedRisk: 0.4,
        retentionRate: 0.5,
        retentionRatio: 0.625,
        reference: false,
        flagged: true,
        withheld: false,
      },
      {
        group: 'Declined',
        headcount: { withheld: true },
        leavers: { withheld: true },
        attritionRate: { withheld: true },
        meanPredictedRisk: { withheld: true },
        retentionRate: { withheld: true },
        retentionRatio: { withheld: true },
        reference: false,
        flagged: false,
        withheld: true,
      },
    ],
  };

  it('hatches a withheld group with the words and shows no figure for it', () => {
    const { container } = render(<FairnessTable report={report} />);
    const declined = screen.getAllByRole('row').find((row) => row.textContent?.startsWith('Declined'))!;
    expect(within(declined).getAllByText(WITHHELD_TEXT)).toHaveLength(5);
    expect(declined.textContent?.replaceAll(WITHHELD_TEXT, '')).not.toMatch(/\d/);
    expect(container.querySelectorAll('.hatch-withheld').length).toBe(5);
  });

  it('names the rule and marks the group under four fifths', () => {
    render(<FairnessTable report={report} />);
    expect(screen.getByText(/29 CFR 1607.4\(D\)/)).toBeTruthy();
    const yes = screen.getAllByRole('row').find((row) => row.textContent?.startsWith('Yes'))!;
    expect(yes.textContent).toContain('0.63');
    expect(yes.textContent).toContain('adverse impact indicated');
  });
});

describe('the approval panel', () => {
  const status = {
    datasetId: 'd1',
    state: 'needs-review' as const,
    reasons: ['Approved under policy version 2; the policy is now version 3 (k changed from 5 to 7).'],
    currentPolicyVersion: 3,
    latest: null,
    history: [
      {
        decision: 'approved' as const,
        comment: 'Fine',
        policyVersion: 2,
        decidedBy: 'privacy@quillfern.example',
        decidedAt: '2026-11-02T09:00:00.000Z',
      },
    ],
  };

  it('says why a dataset needs review again and under which policy it was approved', () => {
    render(<ApprovalPanel status={status} />);
    expect(screen.getByText('Needs review: the policy changed')).toBeTruthy();
    expect(screen.getByText(/k changed from 5 to 7/)).toBeTruthy();
    expect(screen.getByText(/under policy version 2: “Fine”/)).toBeTruthy();
    expect(screen.queryByRole('button', { name: /Approve/ })).toBeNull();
  });

  it('sends back only with a comment, and approves under the current version', async () => {
    const onDecide = vi.fn();
    render(<ApprovalPanel status={status} onDecide={onDecide} />);
    expect((screen.getByRole('button', { name: 'Send back' }) as HTMLButtonElement).disabled).toBe(true);
    fireEvent.change(screen.getByLabelText('Comment (needed to send back)'), {
      target: { value: 'Exclude marital status' },
    });
    await press('Send back');
    expect(onDecide).toHaveBeenLastCalledWith({ decision: 'send-back', comment: 'Exclude marital status' });
    await press('Approve for modelling under policy version 3');
    expect(onDecide).toHaveBeenLastCalledWith({ decision: 'approve', comment: 'Exclude marital status' });
  });
});
