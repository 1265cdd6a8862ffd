import { betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { admin, organization } from 'better-auth/plugins';
import type { Config } from '../config';
import type { Mailer } from '../mail/mailer';
import { mailTemplates } from '../mail/templates';
import { labAccessControl, labRoleLabels, labRoles, type LabRole } from '../../shared/lab-roles';
import { paths } from '../../shared/paths';

export const INVITATION_DAYS = 7;

type AuthDeps = {
  // The Drizzle database (PGlite or node-postgres) and its table objects.
  db: unknown;
  schema?: Record<string, unknown>;
  config: Pick<Config, 'publicBaseUrl' | 'authSecret' | 'env'>;
  mailer: Pick<Mailer, 'send'>;
};

/**
 * better-auth with e-mail + password (verified addresses), labs as
 * organisations with our three roles, and the platform `admin` role.
 * Keep the plugin list equal to the schema generator's config.
 */
export function createAuth({ db, schema, config, mailer }: AuthDeps) {
  const base = config.publicBaseUrl;
  return betterAuth({
    appName: 'Cohesia',
    baseURL: base,
    basePath: '/api/auth',
    secret: config.authSecret,
    trustedOrigins: [base],
    database: drizzleAdapter(db as never, { provider: 'pg', schema: schema as never }),
    user: {
      additionalFields: {
        // Set only through our profile route, which checks the ISO 7064 check digit.
        orcid: { type: 'string', required: false, input: false },
      },
    },
    emailAndPassword: {
      enabled: true,
      requireEmailVerification: true,
      minPasswordLength: 10,
      resetPasswordTokenExpiresIn: 60 * 60,
      sendResetPassword: async ({ user, url }) => {
        await mailer.send(mailTemplates.resetPassword(user.email, user.name, url));
      },
    },
    emailVerification: {
      sendOnSignUp: true,
      sendOnSignIn: true,
      autoSignInAfterVerification: true,
      sendVerificationEmail: async ({ user, url }) => {
        await mailer.send(mailTemplates.verifyEmail(user.email, user.name, url));
      },
    },
    // Limits are ours (server/middleware/rate-limits.ts): one mechanism with our error shape and Retry-After.
    rateLimit: { enabled: false },
    advanced: {
      // Secure (and __Secure- prefixed) cookies whenever the public address is https, whatever NODE_ENV says.
      useSecureCookies: base.startsWith('https://'),
      defaultCookieAttributes: { httpOnly: true, sameSite: 'lax' },
    },
    plugins: [
      admin({ defaultRole: 'user', adminRoles: ['admin'] }),
      organization({
        ac: labAccessControl,
        roles: labRoles,
        creatorRole: 'lead',
        invitationExpiresIn: INVITATION_DAYS * 24 * 60 * 60,
        cancelPendingInvitationsOnReInvite: true,
        requireEmailVerificationOnInvitation: true,
        schema: {
          organization: {
            additionalFields: {
              institution: { type: 'string', required: false },
              rorId: { type: 'string', required: false },
              description: { type: 'string', required: false },
              isDemo: { type: 'boolean', required: false, defaultValue: false, input: false },
            },
          },
        },
        sendInvitationEmail: async ({ id, email, organization: lab, inviter, role }) => {
          const url = `${base}${paths.invitation(id)}`;
          const label = labRoleLabels[role as LabRole] ?? role;
          await mailer.send(mailTemplates.labInvitation(email, inviter.user.name, lab.name, label.toLowerCase(), url));
        },
      }),
    ],
  });
}

export type Auth = ReturnType<typeof createAuth>;
