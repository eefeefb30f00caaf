import { useState } from 'react';
import { createBrowserRouter, type RouteObject, RouterProvider } from 'react-router-dom';
import { paths } from '../config/paths';
import { AppRootRoute } from './routes/app-root';
import { AuditTrailRoute } from './routes/audit-trail';
import { DatasetRoute } from './routes/dataset';
import { DatasetReviewRoute } from './routes/dataset-review';
import { DatasetsRoute } from './routes/datasets';
import { HomeRoute } from './routes/home';
import { ModelFairnessRoute } from './routes/model-fairness';
import { ModelsRoute } from './routes/models';
import { MyTeamsRoute } from './routes/my-teams';
import { NotFoundRoute } from './routes/not-found';
import { PrivacyPolicyRoute } from './routes/privacy-policy';
import { ReviewQueueRoute } from './routes/review-queue';
import { TeamBriefRoute } from './routes/team-brief';

/** Feature screens add their route here, as children of the shell. */
export const routes: RouteObject[] = [
  {
    path: paths.home.path,
    element: <AppRootRoute />,
    children: [
      { index: true, element: <HomeRoute /> },
      { path: paths.datasets.path, element: <DatasetsRoute /> },
      { path: paths.dataset.path, element: <DatasetRoute /> },
      { path: paths.models.path, element: <ModelsRoute /> },
      { path: paths.modelCompare.path, lazy: () => import('./routes/model-compare') },
      { path: paths.modelRun.path, lazy: () => import('./routes/model-run') },
      { path: paths.modelCard.path, lazy: () => import('./routes/model-card') },
      { path: paths.privacyPolicy.path, element: <PrivacyPolicyRoute /> },
      { path: paths.auditTrail.path, element: <AuditTrailRoute /> },
      { path: paths.reviewQueue.path, element: <ReviewQueueRoute /> },
      { path: paths.datasetReview.path, element: <DatasetReviewRoute /> },
      { path: paths.modelFairness.path, element: <ModelFairnessRoute /> },
      { path: paths.teams.path, element: <MyTeamsRoute /> },
      { path: paths.teamBrief.path, element: <TeamBriefRoute /> },
      { path: '*', element: <NotFoundRoute /> },
    ],
  },
];

export function AppRouter() {
  const [router] = useState(() => createBrowserRouter(routes));
  return <RouterProvider router={router} />;
}
