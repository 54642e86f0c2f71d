/** Every URL of the app, once, with builders. No URL strings elsewhere. */
export const paths = {
  signIn: { path: '/sign-in', href: (next?: string) => (next ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in') },
  /** The home page: your projects (the app's first page after signing in). */
  home: { path: '/', href: () => '/' },
  /** The home page's list of what waits for you (the navigation's count links here). */
  waiting: { href: () => '/#waiting' },
  project: { path: '/projects/:projectId', href: (projectId: number) => `/projects/${projectId}` },
  /** A project's activity; `query` is the filter and page (`?person=7&kind=decisions&page=2`). */
  activity: { path: '/projects/:projectId/activity', href: (projectId: number, query = '') => `/projects/${projectId}/activity${query}` },
  newSpec: { path: '/projects/:projectId/specs/new', href: (projectId: number) => `/projects/${projectId}/specs/new` },
  specImport: { path: '/projects/:projectId/specs/import', href: (projectId: number) => `/projects/${projectId}/specs/import` },
  spec: { path: '/specs/:specId', href: (specId: number) => `/specs/${specId}` },
  specHistory: { path: '/specs/:specId/history', href: (specId: number) => `/specs/${specId}/history` },
  proposal: { path: '/proposals/:proposalId', href: (proposalId: number) => `/proposals/${proposalId}` },
  /** Two options side by side; the state is the query (`?a=12&b=15&tailA=wilson&tailB=cascode`, features/compare/lib/compare-address.ts). */
  compare: { path: '/compare', href: (query: string) => `/compare${query}` },
  report: { path: '/proposals/:proposalId/report', href: (proposalId: number) => `/proposals/${proposalId}/report` },
  people: { path: '/people', href: () => '/people' },
  /** The search's results: `query` is `?q=…`, with `&kind=…&page=…` for one kind's pages. */
  search: { path: '/search', href: (query = '') => `/search${query}` },
  /** Your own account and e-mail preference (linked from e-mails, so keep it stable). */
  profile: { path: '/profile', href: () => '/profile' },
  /** The local mail server's messages (admins). */
  mail: { path: '/admin/mail', href: () => '/admin/mail' },
  /** Setting a new password from a one-time link; the token is the fragment (`#…`), never sent in a request line. Linked from e-mails: keep it stable. */
  passwordReset: { path: '/password-reset', href: () => '/password-reset' },
} as const;

/** API endpoints, once. */
export const api = {
  csrf: '/api/auth/csrf',
  login: '/api/auth/login',
  logout: '/api/auth/logout',
  /** GET: the signed-in user; PATCH { notify?, noticesOff? }: their own e-mail preferences (the master switch, the kinds turned off). */
  me: '/api/auth/me',
  /** POST { currentPassword, newPassword }: the signed-in person's own password. */
  ownPassword: '/api/auth/password',
  /** POST { token, newPassword }: a new password through a one-time reset link. */
  passwordReset: '/api/auth/password-reset',
  /** GET: your personal API tokens; POST { name }: a new one (its token answered once). */
  apiTokens: '/api/auth/tokens',
  /** DELETE: revoke one of your personal API tokens. */
  apiToken: (id: number) => `/api/auth/tokens/${id}`,
  /** Messages the built-in local mail server received, newest first (admins). */
  adminMail: '/api/admin/mail',
  users: '/api/users',
  user: (id: number) => `/api/users/${id}`,
  /** POST: mail the person a one-time link to set a new password (admins). */
  userPasswordReset: (id: number) => `/api/users/${id}/password-reset`,
  projects: '/api/projects',
  project: (id: number) => `/api/projects/${id}`,
  members: (projectId: number) => `/api/projects/${projectId}/members`,
  member: (projectId: number, userId: number) => `/api/projects/${projectId}/members/${userId}`,
  projectSpecs: (projectId: number) => `/api/projects/${projectId}/specs`,
  /** GET (`?actor=&kind=&page=&pageSize=`): a page of the project's activity, newest first. */
  projectActivity: (projectId: number, query: string) => `/api/projects/${projectId}/activity${query}`,
  /** The project's activity as CSV (`?actor=&kind=`: the same filters, every event). */
  projectActivityCsv: (projectId: number, query: string) => `/api/projects/${projectId}/activity.csv${query}`,
  /** How many of each kind of work wait for the signed-in person, across their projects. */
  waitingCounts: '/api/waiting/counts',
  /** GET (`?kind=&page=&pageSize=`): one kind of what waits for the signed-in person, oldest first. */
  waiting: (query: string) => `/api/waiting${query}`,
  /** GET (`?q=&kind=&page=&pageSize=`): projects, specs, proposals and people the signed-in person may see. */
  search: (query: string) => `/api/search${query}`,
  projectProposals: (projectId: number, query: string) => `/api/projects/${projectId}/proposals${query}`,
  /** POST multipart (field `file`): many specs from one CSV or JSON file; `dryRun` reports without saving. */
  specImport: (projectId: number, dryRun: boolean) => `/api/projects/${projectId}/specs/import${dryRun ? '?dryRun=true' : ''}`,
  /** The results of a batch's proposals as one CSV. */
  batchResultsCsv: (projectId: number, proposalIds: readonly number[]) => `/api/projects/${projectId}/proposals.csv?ids=${proposalIds.join(',')}`,
  /** GET (`?page=&pageSize=&q=&state=`): a page of the project's device library; POST (multipart, field `file`): upload .model cards. */
  projectDevices: (projectId: number, query = '') => `/api/projects/${projectId}/devices${query}`,
  /** GET: one card (removed and replaced ones too); PUT (multipart, field `file`): replace its text; DELETE: remove it from the library. */
  projectDevice: (projectId: number, deviceId: number) => `/api/projects/${projectId}/devices/${deviceId}`,
  /** GET: the card a spec recorded (`deviceModel { name, checksum }`), and the library's card of that name today. */
  recordedDevice: (projectId: number, name: string, checksum: string) =>
    `/api/projects/${projectId}/devices/recorded?${new URLSearchParams({ name, checksum })}`,
  spec: (id: number) => `/api/specs/${id}`,
  specVersions: (id: number) => `/api/specs/${id}/versions`,
  specDiff: (id: number, from: number, to: number) => `/api/specs/${id}/diff?from=${from}&to=${to}`,
  specProposals: (id: number) => `/api/specs/${id}/proposals`,
  proposal: (id: number) => `/api/proposals/${id}`,
  decision: (id: number) => `/api/proposals/${id}/decision`,
  /** The full evaluation an override would get, recorded nowhere. */
  evaluation: (id: number) => `/api/proposals/${id}/evaluation`,
  review: (id: number) => `/api/proposals/${id}/review`,
  withdrawal: (id: number) => `/api/proposals/${id}/withdrawal`,
  audit: (id: number) => `/api/proposals/${id}/audit`,
  /** GET: the proposal's comment threads; POST: a new thread on one anchor. */
  comments: (id: number) => `/api/proposals/${id}/comments`,
  /** PATCH `{ resolved }`: resolve or reopen a thread. */
  commentThread: (id: number, threadId: number) => `/api/proposals/${id}/comments/${threadId}`,
  /** POST: a reply to a thread. */
  commentReplies: (id: number, threadId: number) => `/api/proposals/${id}/comments/${threadId}/replies`,
  rankingCsv: (id: number) => `/api/proposals/${id}/ranking.csv`,
  exportJson: (id: number) => `/api/proposals/${id}/export.json`,
  netlist: (id: number, topology: string, drive: 'differential' | 'common-mode' = 'differential') =>
    `/api/proposals/${id}/netlist.cir?topology=${encodeURIComponent(topology)}&drive=${drive}`,
  /** The latest decision's design, own values included, exactly as verified and signed off. */
  decidedNetlist: (id: number, drive: 'differential' | 'common-mode' = 'differential') => `/api/proposals/${id}/netlist.cir?source=decision&drive=${drive}`,
  /** GET: latest verification and Monte Carlo jobs; POST: ask for a verification of every option. */
  verification: (id: number) => `/api/proposals/${id}/verification`,
  /** GET (`?page=&pageSize=`): a page of the proposal's bench measurements, without points; POST (multipart, field `file`, optional `note`): upload one CSV. */
  measurements: (id: number, query = '') => `/api/proposals/${id}/measurements${query}`,
  /** GET: one measurement with its points. */
  measurement: (id: number, measurementId: number) => `/api/proposals/${id}/measurements/${measurementId}`,
  /** The original uploaded CSV of one measurement (a download). */
  measurementFile: (id: number, measurementId: number) => `/api/proposals/${id}/measurements/${measurementId}/file`,
  /** POST { topology, runs? }: SPICE Monte Carlo of one option. */
  monteCarlo: (id: number) => `/api/proposals/${id}/verification/monte-carlo`,
  /** DELETE: withdraw a waiting or simulating SPICE job (its requester, a reviewer or an administrator). */
  verificationJob: (id: number, jobId: number) => `/api/proposals/${id}/verification/${jobId}`,
  analyze: '/api/analyze',
  tradeoff: '/api/tradeoff',
  specSchema: '/api/schema/spec',
  /** The spec CSV template: every column, and one example row. */
  specCsvTemplate: '/api/schema/spec.csv',
  topologies: '/api/topologies',
} as const;
