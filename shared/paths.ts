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
  mailbox: '/dev/mailbox',
} as const;
