/** Every route of the frontend: its pattern for the router and a builder for links. */
export const paths = {
  home: {
    path: '/',
    href: () => '/',
  },
  datasets: {
    path: '/datasets',
    href: () => '/datasets',
  },
  dataset: {
    path: '/datasets/:id',
    href: (id: string) => `/datasets/${encodeURIComponent(id)}`,
  },
  models: {
    path: '/models',
    href: (datasetId?: string) =>
      datasetId ? `/models?datasetId=${encodeURIComponent(datasetId)}` : '/models',
  },
  modelCompare: {
    path: '/models/compare',
    href: (ids: readonly string[]) => `/models/compare?ids=${ids.map(encodeURIComponent).join(',')}`,
  },
  modelRun: {
    path: '/models/:id',
    href: (id: string) => `/models/${encodeURIComponent(id)}`,
  },
  modelCard: {
    path: '/models/:id/card',
    href: (id: string) => `/models/${encodeURIComponent(id)}/card`,
  },
  privacyPolicy: {
    path: '/privacy-policy',
    href: () => '/privacy-policy',
  },
  reviewQueue: {
    path: '/review',
    href: () => '/review',
  },
  datasetReview: {
    path: '/review/datasets/:id',
    href: (id: string) => `/review/datasets/${encodeURIComponent(id)}`,
  },
  modelFairness: {
    path: '/models/:id/fairness',
    href: (id: string) => `/models/${encodeURIComponent(id)}/fairness`,
  },
  auditTrail: {
    path: '/audit',
    href: () => '/audit',
  },
  teams: {
    path: '/teams',
    href: () => '/teams',
  },
  teamBrief: {
    path: '/teams/:id',
    href: (id: string) => `/teams/${encodeURIComponent(id)}`,
  },
  signIn: {
    path: '/auth/login',
    href: (returnTo: string) => `/auth/login?returnTo=${encodeURIComponent(returnTo)}`,
  },
  signOut: {
    path: '/auth/logout',
    href: () => '/auth/logout',
  },
} as const;
