/** Every URL of the app, once, with builders. No URL strings elsewhere. */
export const paths = {
  signIn: { path: '/sign-in', href: (next?: string) => (next ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in') },
  workbench: { path: '/', href: () => '/' },
  project: { path: '/projects/:projectId', href: (projectId: number) => `/projects/${projectId}` },
  newSpec: { path: '/projects/:projectId/specs/new', href: (projectId: number) => `/projects/${projectId}/specs/new` },
  spec: { path: '/specs/:specId', href: (specId: number) => `/specs/${specId}` },
  specHistory: { path: '/specs/:specId/history', href: (specId: number) => `/specs/${specId}/history` },
  proposal: { path: '/proposals/:proposalId', href: (proposalId: number) => `/proposals/${proposalId}` },
  report: { path: '/proposals/:proposalId/report', href: (proposalId: number) => `/proposals/${proposalId}/report` },
  people: { path: '/people', href: () => '/people' },
} as const;

/** API endpoints, once. */
export const api = {
  csrf: '/api/auth/csrf',
  login: '/api/auth/login',
  logout: '/api/auth/logout',
  me: '/api/auth/me',
  users: '/api/users',
  user: (id: number) => `/api/users/${id}`,
  projects: '/api/projects',
  project: (id: number) => `/api/projects/${id}`,
  members: (projectId: number) => `/api/projects/${projectId}/members`,
  member: (projectId: number, userId: number) => `/api/projects/${projectId}/members/${userId}`,
  projectSpecs: (projectId: number) => `/api/projects/${projectId}/specs`,
  projectProposals: (projectId: number, query: string) => `/api/projects/${projectId}/proposals${query}`,
  spec: (id: number) => `/api/specs/${id}`,
  specVersions: (id: number) => `/api/specs/${id}/versions`,
  specDiff: (id: number, from: number, to: number) => `/api/specs/${id}/diff?from=${from}&to=${to}`,
  specProposals: (id: number) => `/api/specs/${id}/proposals`,
  proposal: (id: number) => `/api/proposals/${id}`,
  decision: (id: number) => `/api/proposals/${id}/decision`,
  /** The full evaluation an override would get, recorded nowhere. */
  evaluation: (id: number) => `/api/proposals/${id}/evaluation`,
  review: (id: number) => `/api/proposals/${id}/review`,
  audit: (id: number) => `/api/proposals/${id}/audit`,
  rankingCsv: (id: number) => `/api/proposals/${id}/ranking.csv`,
  exportJson: (id: number) => `/api/proposals/${id}/export.json`,
  netlist: (id: number, topology: string, drive: 'differential' | 'common-mode' = 'differential') =>
    `/api/proposals/${id}/netlist.cir?topology=${encodeURIComponent(topology)}&drive=${drive}`,
  /** GET: latest verification and Monte Carlo jobs; POST: ask for a verification of every option. */
  verification: (id: number) => `/api/proposals/${id}/verification`,
  /** POST { topology, runs? }: SPICE Monte Carlo of one option. */
  monteCarlo: (id: number) => `/api/proposals/${id}/verification/monte-carlo`,
  analyze: '/api/analyze',
  specSchema: '/api/schema/spec',
  topologies: '/api/topologies',
} as const;
