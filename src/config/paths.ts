// Route patterns (for the router) and href builders (for links) kept side by side so they cannot drift.
export const paths = {
  home: { path: '/', href: () => '/' },
  login: { path: '/login', href: () => '/login' },
  invite: { path: '/invite/:token', href: (token: string) => `/invite/${encodeURIComponent(token)}` },
  forgotPassword: { path: '/forgot-password', href: () => '/forgot-password' },
  resetPassword: {
    path: '/reset-password/:token',
    href: (token: string) => `/reset-password/${encodeURIComponent(token)}`,
  },
  account: { path: '/account', href: () => '/account' },
  athletes: { path: '/athletes', href: () => '/athletes' },
  athlete: { path: '/athletes/:athleteId', href: (id: string) => `/athletes/${id}` },
  sessions: { path: '/sessions', href: () => '/sessions' },
  session: { path: '/sessions/:sessionId', href: (id: string) => `/sessions/${id}` },
  upload: {
    path: '/upload',
    href: (sessionId?: string) => (sessionId ? `/upload?session=${sessionId}` : '/upload'),
  },
  clip: { path: '/clips/:clipId', href: (id: string) => `/clips/${id}` },
  club: { path: '/club', href: () => '/club' },
} as const;
