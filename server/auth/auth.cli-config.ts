// Used only by the schema generator (`npm run db:auth-schema`): the same
// plugins as the app, over a throw-away in-memory database.
import { PGlite } from '@electric-sql/pglite';
import { drizzle } from 'drizzle-orm/pglite';
import { createAuth } from './create-auth';

export const auth = createAuth({
  db: drizzle(new PGlite()),
  config: { publicBaseUrl: 'http://localhost:3000', authSecret: 'x'.repeat(32), env: 'development' },
  mailer: { send: async () => {} },
});
