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
  privacyPolicy: {
    path: '/privacy-policy',
    href: () => '/privacy-policy',
  },
  auditTrail: {
    path: '/audit',
    href: () => '/audit',
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
