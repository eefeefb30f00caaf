import { PageHeader } from '../../components/page-header';
import { RoleOverview } from '../../features/home/components/role-overview';
import { useMe } from '../../lib/auth';

export function HomeRoute() {
  const me = useMe().data;
  if (!me) return null;
  return (
    <>
      <PageHeader
        title={`Welcome, ${me.name}`}
        description="Coppice helps find out why employees leave and shares aggregated findings, never individuals."
      />
      <RoleOverview roles={me.roles} />
    </>
  );
}
