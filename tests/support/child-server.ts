// The server runtime as its own process, for tests that kill it (SIGKILL) mid-job.
// The same startCohesia as server/main.ts, without the client; it also prints every
// change of a job's state and phase, read from its own database, so the test can
// choose the moment to kill it.
import { sql } from 'drizzle-orm';
import { loadConfig } from '../../server/config';
import { startCohesia } from '../../server/runtime';

const running = await startCohesia({ config: loadConfig(), client: 'none' });
console.log(`child-ready ${running.url}`);
const seen = new Map<string, string>();
setInterval(async () => {
  const result = await running.database.db
    .execute(sql`select id, kind, state, phase, attempts from job where kind <> 'lift-embargoes' order by created_at`)
    .catch(() => null);
  for (const r of ((result as unknown as { rows?: Array<Record<string, unknown>> })?.rows ?? [])) {
    const line = JSON.stringify(r);
    if (seen.get(String(r.id)) !== line) {
      seen.set(String(r.id), line);
      console.log(`child-job ${line}`);
    }
  }
}, 40);
process.on('SIGTERM', () => void running.close().then(() => process.exit(0)));
