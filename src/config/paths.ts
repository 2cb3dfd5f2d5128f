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
  clip: {
    path: '/clips/:clipId',
    /** At a frame, with a metric's readout in view (a flag opens its clip this way). */
    href: (id: string, at?: { frame?: number; metric?: string }) => {
      const query = new URLSearchParams();
      if (at?.frame !== undefined) query.set('frame', String(at.frame));
      if (at?.metric) query.set('metric', at.metric);
      const text = query.toString();
      return text ? `/clips/${id}?${text}` : `/clips/${id}`;
    },
  },
  compare: {
    path: '/compare',
    /** Two clips side by side: a on the left (the baseline by default), b on the right. */
    href: (a?: string | null, b?: string | null) => {
      const query = new URLSearchParams();
      if (a) query.set('a', a);
      if (b) query.set('b', b);
      const text = query.toString();
      return text ? `/compare?${text}` : '/compare';
    },
  },
  review: { path: '/reviews/:reviewId', href: (id: string) => `/reviews/${id}` },
  reviewEdit: { path: '/reviews/:reviewId/edit', href: (id: string) => `/reviews/${id}/edit` },
  tolerances: { path: '/tolerances', href: () => '/tolerances' },
  exports: { path: '/exports', href: () => '/exports' },
  codebook: { path: '/exports/codebook', href: () => '/exports/codebook' },
  club: { path: '/club', href: () => '/club' },
} as const;
