import { useState } from 'react';
import { createBrowserRouter, type RouteObject, RouterProvider } from 'react-router-dom';
import { paths } from '../config/paths';
import { AppRootRoute } from './routes/app-root';
import { AuditTrailRoute } from './routes/audit-trail';
import { DatasetRoute } from './routes/dataset';
import { DatasetsRoute } from './routes/datasets';
import { HomeRoute } from './routes/home';
import { NotFoundRoute } from './routes/not-found';
import { PrivacyPolicyRoute } from './routes/privacy-policy';

/** Feature screens add their route here, as children of the shell. */
export const routes: RouteObject[] = [
  {
    path: paths.home.path,
    element: <AppRootRoute />,
    children: [
      { index: true, element: <HomeRoute /> },
      { path: paths.datasets.path, element: <DatasetsRoute /> },
      { path: paths.dataset.path, element: <DatasetRoute /> },
      { path: paths.privacyPolicy.path, element: <PrivacyPolicyRoute /> },
      { path: paths.auditTrail.path, element: <AuditTrailRoute /> },
      { path: '*', element: <NotFoundRoute /> },
    ],
  },
];

export function AppRouter() {
  const [router] = useState(() => createBrowserRouter(routes));
  return <RouterProvider router={router} />;
}
