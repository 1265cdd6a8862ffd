import pg from 'pg';

/** The URL of another database on the same PostgreSQL server. */
export function databaseUrl(adminUrl: string, name: string): string {
  const u = new URL(adminUrl);
  u.pathname = `/${name}`;
  return u.toString();
}

export async function adminQuery(adminUrl: string, text: string): Promise<pg.QueryResult> {
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    return await client.query(text);
  } finally {
    await client.end();
  }
}

/** A fresh database for one test app, copied from the migrated, seeded template (fast: a file copy on the server). */
export async function createTestDatabase(adminUrl: string, template: string, name: string): Promise<string> {
  await adminQuery(adminUrl, `create database ${name} template ${template}`);
  return databaseUrl(adminUrl, name);
}

/** Drops the template and every test database made from it (names start with the template's). */
export async function dropTestDatabases(adminUrl: string, template: string) {
  const { rows } = await adminQuery(adminUrl, `select datname from pg_database where datname like '${template}%'`);
  // Copies (longer names) before the template itself.
  const names = (rows as Array<{ datname: string }>).map((r) => r.datname).sort((a, b) => b.length - a.length);
  for (const name of names) await adminQuery(adminUrl, `drop database if exists ${name} with (force)`);
}
