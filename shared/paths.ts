/** Every client path in one module; the server uses it to build links in mail. */
export const paths = {
  home: '/',
  // The search over every released dataset; its query and facets are URL search params.
  catalogue: '/catalogue',
  signIn: '/sign-in',
  signUp: '/sign-up',
  checkEmail: '/check-email',
  forgotPassword: '/forgot-password',
  resetPassword: '/reset-password',
  account: '/account',
  myLabs: '/labs',
  createLab: '/labs/new',
  lab: (slug: string) => `/labs/${encodeURIComponent(slug)}`,
  // The lab's public page (the page above is the members' management page).
  labProfile: (slug: string) => `/labs/${encodeURIComponent(slug)}/about`,
  invitation: (id: string) => `/invitations/${encodeURIComponent(id)}`,
  adminUsers: '/admin/users',
  adminLabs: '/admin/labs',
  adminPlans: '/admin/plans',
  adminAudit: '/admin/audit',
  labAudit: (slug: string) => `/labs/${encodeURIComponent(slug)}/audit`,
  labStorage: (slug: string) => `/labs/${encodeURIComponent(slug)}/storage`,
  labDatasets: (slug: string) => `/labs/${encodeURIComponent(slug)}/datasets`,
  newDataset: (slug: string) => `/labs/${encodeURIComponent(slug)}/datasets/new`,
  draft: (slug: string, draftId: string) => `/labs/${encodeURIComponent(slug)}/drafts/${encodeURIComponent(draftId)}`,
  draftFile: (slug: string, draftId: string, fileId: string) =>
    `/labs/${encodeURIComponent(slug)}/drafts/${encodeURIComponent(draftId)}/files/${encodeURIComponent(fileId)}`,
  reviewQueue: (slug: string) => `/labs/${encodeURIComponent(slug)}/review`,
  // Landing pages: a release, and a dataset's all-versions page (shows the newest release).
  release: (suffix: string) => `/releases/${suffix}`,
  datasetLanding: (suffix: string) => `/datasets/${suffix}`,
  resolveDoi: (doi: string) => `/doi/${doi}`,
  labAccessRequests: (slug: string) => `/labs/${encodeURIComponent(slug)}/access-requests`,
  // The comparison being assembled in this browser, a saved (shareable) one, and the scaling view.
  compare: '/compare',
  savedComparison: (id: string) => `/compare/${encodeURIComponent(id)}`,
  scaling: '/compare/scaling',
  apiDocs: '/api-docs',
  mailbox: '/dev/mailbox',
} as const;
