/** Every client route, as { path, href() }, so links never hand-build URLs. */
export const paths = {
  home: { path: '/', href: () => '/' },
  signIn: { path: '/sign-in', href: (redirectTo?: string) => (redirectTo ? `/sign-in?redirectTo=${encodeURIComponent(redirectTo)}` : '/sign-in') },
  users: { path: '/admin/users', href: () => '/admin/users' },
  catalogue: { path: '/catalogue', href: (search?: string) => (search ? `/catalogue?${search}` : '/catalogue') },
  catalogueBrowse: { path: '/catalogue/browse', href: () => '/catalogue/browse' },
  partNew: { path: '/catalogue/new', href: () => '/catalogue/new' },
  part: { path: '/catalogue/:sku', href: (sku: string) => `/catalogue/${encodeURIComponent(sku)}` },
  partEdit: { path: '/catalogue/:sku/edit', href: (sku: string) => `/catalogue/${encodeURIComponent(sku)}/edit` },
  planner: { path: '/planner', href: (search?: string) => (search ? `/planner?${search}` : '/planner') },
  plans: { path: '/plans', href: () => '/plans' },
  plan: { path: '/plans/:id', href: (id: string) => `/plans/${encodeURIComponent(id)}` },
  rangeEdit: { path: '/ranges/:code/edit', href: (code: string) => `/ranges/${encodeURIComponent(code)}/edit` },
} as const;
