/** Every client URL once: the route pattern and a builder for links. */
export const paths = {
  home: { pattern: '/', href: () => '/' },
  signIn: { pattern: '/sign-in', href: (next?: string) => (next ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in') },
  setPassword: { pattern: '/set-password/:token', href: (token: string) => `/set-password/${token}` },
  people: { pattern: '/admin/people', href: () => '/admin/people' },
} as const;
