import { Outlet } from 'react-router-dom';
import { ErrorNotice } from '../../components/error-notice';
import { AppShell } from '../../components/layout/app-shell';
import { isApiError } from '../../lib/api-client';
import { signOut, useMe } from '../../lib/auth';

/** Every page needs a signed-in user; a 401 has already sent the browser to sign in. */
export function AppRootRoute() {
  const me = useMe();
  if (me.isPending) return <p className="p-8 font-sans text-slate-600">Loading Coppice…</p>;
  if (me.isError) {
    if (isApiError(me.error) && me.error.status === 401) {
      return <p className="p-8 font-sans text-slate-600">Taking you to sign in…</p>;
    }
    return (
      <div className="p-8 font-sans">
        <ErrorNotice error={me.error} title="Coppice could not load your account" />
      </div>
    );
  }
  return (
    <AppShell me={me.data} onSignOut={() => void signOut()}>
      <Outlet />
    </AppShell>
  );
}
