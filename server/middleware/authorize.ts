import type { Request, RequestHandler } from 'express';
import { fromNodeHeaders } from 'better-auth/node';
import { labRoleCan, type LabPermission, type LabRole } from '../../shared/lab-roles';
import type { Auth } from '../auth/create-auth';
import { AppError, forbidden, notFound, unauthenticated } from '../errors';
import type { LabsRepository } from '../repositories/labs.repository';
import type { TokensService } from '../services/tokens.service';

/** Who may call a route. Every route names one; there is no other check. */
export type Access =
  | { kind: 'public' }
  // sessionOnly: not with an API token (token management, account changes).
  | { kind: 'signed-in'; sessionOnly?: boolean }
  | { kind: 'admin' }
  // A lab route: `:slug` names the lab, the caller's lab role must grant `permission`.
  | { kind: 'lab'; permission: LabPermission; allowAdmin?: boolean }
  // Pages of the local fakes (mailbox), only when they run.
  | { kind: 'fakes' };

export type Actor = {
  user: { id: string; name: string; email: string; role?: string | null; emailVerified: boolean };
  headers: Headers;
  // Set when the request came with an API token instead of a browser session.
  token?: { scopes: Array<'read' | 'deposit'> };
};

export type LabContext = { id: string; slug: string; name: string; role: LabRole | null };

declare module 'express-serve-static-core' {
  interface Locals {
    actor?: Actor;
    lab?: LabContext;
  }
}

export const access = {
  public: { kind: 'public' } as Access,
  signedIn: { kind: 'signed-in' } as Access,
  session: { kind: 'signed-in', sessionOnly: true } as Access,
  admin: { kind: 'admin' } as Access,
  fakes: { kind: 'fakes' } as Access,
  lab: (permission: LabPermission): Access => ({ kind: 'lab', permission }),
  // Lab members whose role grants it, or a platform administrator.
  labOrAdmin: (permission: LabPermission): Access => ({ kind: 'lab', permission, allowAdmin: true }),
};

type Deps = { auth: Auth; labs: LabsRepository; fakes: boolean; tokens?: Pick<TokensService, 'authenticate'> };

/** Builds the one authorisation middleware from a route's access rule. */
export function createAuthorize({ auth, labs, fakes, tokens }: Deps) {
  async function loadActor(req: Request): Promise<Actor | undefined> {
    const headers = fromNodeHeaders(req.headers);
    const bearer = /^Bearer\s+(\S+)$/i.exec(req.headers.authorization ?? '')?.[1];
    if (bearer && tokens) {
      const found = await tokens.authenticate(bearer);
      if (!found) throw new AppError('bad_token', 'This API token is not valid or was revoked.', 401);
      return { user: found.user as Actor['user'], headers, token: { scopes: found.scopes } };
    }
    // better-auth keeps sessions only in cookies: a request with none is a visitor, and asking better-auth
    // would cost it a context of its own for every anonymous page view.
    if (!req.headers.cookie) return undefined;
    const session = await auth.api.getSession({ headers });
    if (!session) return undefined;
    return { user: session.user as Actor['user'], headers };
  }

  return function authorize(rule: Access): RequestHandler {
    return async (req, res, next) => {
      if (rule.kind === 'fakes') {
        if (!fakes) throw notFound('This page');
        return next();
      }
      const actor = await loadActor(req);
      if (actor) res.locals.actor = actor;
      if (rule.kind === 'public') {
        if (req.params.slug) res.locals.lab = await labContext(String(req.params.slug), actor);
        return next();
      }
      if (!actor) throw unauthenticated();
      if (actor.token) {
        if ((rule.kind === 'signed-in' && rule.sessionOnly) || rule.kind === 'admin') throw forbidden('Sign in with a browser session for this; API tokens cannot do it.');
        if (req.method !== 'GET' && !actor.token.scopes.includes('deposit')) throw forbidden('This API token may only read. Create one with the deposit scope to change data.');
      }
      if (rule.kind === 'signed-in') return next();
      if (rule.kind === 'admin') {
        if (actor.user.role !== 'admin') throw forbidden('Only platform administrators can do this.');
        return next();
      }
      const lab = await labContext(String(req.params.slug), actor);
      const asAdmin = rule.allowAdmin && actor.user.role === 'admin';
      if (!asAdmin && !labRoleCan(lab.role, rule.permission)) {
        throw forbidden(lab.role ? `As ${lab.role} of ${lab.name} you cannot do this.` : `You are not a member of ${lab.name}.`);
      }
      res.locals.lab = lab;
      next();
    };
  };

  async function labContext(slug: string, actor: Actor | undefined): Promise<LabContext> {
    const lab = await labs.findBySlug(slug);
    if (!lab) throw notFound('The lab');
    const role = actor ? await labs.roleOf(lab.id, actor.user.id) : null;
    return { id: lab.id, slug: lab.slug, name: lab.name, role };
  }
}

export type Authorize = ReturnType<typeof createAuthorize>;
