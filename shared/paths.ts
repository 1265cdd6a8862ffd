/** Every client path in one module; the server uses it to build links in mail. */
export const paths = {
  home: '/',
  signIn: '/sign-in',
  signUp: '/sign-up',
  checkEmail: '/check-email',
  forgotPassword: '/forgot-password',
  resetPassword: '/reset-password',
  account: '/account',
  myLabs: '/labs',
  createLab: '/labs/new',
  lab: (slug: string) => `/labs/${encodeURIComponent(slug)}`,
  invitation: (id: string) => `/invitations/${encodeURIComponent(id)}`,
  adminUsers: '/admin/users',
  adminLabs: '/admin/labs',
  adminPlans: '/admin/plans',
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
  mailbox: '/dev/mailbox',
} as const;
