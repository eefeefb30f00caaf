/** Every route of the frontend: its pattern for the router and a builder for links. */
export const paths = {
  home: {
    path: '/',
    href: () => '/',
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
