import { useState } from 'react';
import { createBrowserRouter, type RouteObject, RouterProvider } from 'react-router-dom';
import { paths } from '../config/paths';
import { AppRootRoute } from './routes/app-root';
import { DatasetRoute } from './routes/dataset';
import { DatasetsRoute } from './routes/datasets';
import { HomeRoute } from './routes/home';
import { NotFoundRoute } from './routes/not-found';

/** Feature screens add their route here, as children of the shell. */
export const routes: RouteObject[] = [
  {
    path: paths.home.path,
    element: <AppRootRoute />,
    children: [
      { index: true, element: <HomeRoute /> },
      { path: paths.datasets.path, element: <DatasetsRoute /> },
      { path: paths.dataset.path, element: <DatasetRoute /> },
      { path: '*', element: <NotFoundRoute /> },
    ],
  },
];

export function AppRouter() {
  const [router] = useState(() => createBrowserRouter(routes));
  return <RouterProvider router={router} />;
}
