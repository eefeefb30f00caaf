import { ROLE_LABELS, ROLES, type Role } from '../../../../../shared/roles';
import { Card } from '../../../components/card';
import { Caution } from '../../../components/caution';

const roleTasks: Record<Role, { summary: string; tasks: string[] }> = {
  analyst: {
    summary: 'You turn the HR system’s staff export into an explanation of why people leave.',
    tasks: [
      'Upload a dataset (an XLSX or CSV export) and check its quality.',
      'Map its columns: employee ID, team, department, manager e-mail and how leaving is defined.',
      'Train model runs (classification trees), compare them and read their drivers and segments.',
      'Write a suggested action for each driver and ask the privacy officers to publish team briefs.',
    ],
  },
  privacy_officer: {
    summary: 'You decide what Coppice may show, and to whom.',
    tasks: [
      'Set the privacy policy: the minimum group size k, the blocked fields, the proxy threshold and retention.',
      'Approve mapped datasets for modelling and publish approved model runs as team briefs.',
      'Review proxy warnings: allowed fields strongly associated with a blocked one.',
      'Run the fairness screen on aggregated figures.',
      'Read the audit trail of every sensitive action.',
    ],
  },
  manager: {
    summary: 'You read team briefs for your own teams.',
    tasks: [
      'See headcount and attrition rate for each of your teams beside the department and the organisation.',
      'Read the main drivers for your team in plain words, with the analyst’s suggested actions.',
      'See the segments your team falls into; groups smaller than k employees are withheld.',
    ],
  },
};

export type RoleOverviewProps = {
  roles: readonly Role[];
};

/** What each of the user's roles does in Coppice, in the order of ROLES. */
export function RoleOverview({ roles }: RoleOverviewProps) {
  const held = ROLES.filter((role) => roles.includes(role));
  if (held.length === 0) {
    return (
      <Card title="No role yet">
        <p>Your account has no Coppice role. Ask your administrator to add you to the right group.</p>
      </Card>
    );
  }
  return (
    <div className="grid gap-6 md:grid-cols-2">
      {held.map((role) => (
        <Card key={role} title={`As ${ROLE_LABELS[role].toLowerCase()}`}>
          <p className="mb-3 text-slate-700">{roleTasks[role].summary}</p>
          <ul className="list-disc space-y-1 pl-5 text-sm text-slate-700">
            {roleTasks[role].tasks.map((task) => (
              <li key={task}>{task}</li>
            ))}
          </ul>
          {role === 'manager' && <Caution className="mt-4" />}
        </Card>
      ))}
    </div>
  );
}
