// `npm run backup -- --out <folder>`: database image + every referenced object + manifest.json (see server/backup/).
import { parseArgs } from 'node:util';
import { loadConfig } from '../server/config';
import { backupInstance } from '../server/backup/create-backup';

const { values } = parseArgs({ options: { out: { type: 'string' } } });
if (!values.out) {
  console.error('Usage: npm run backup -- --out <folder>');
  process.exit(2);
}
try {
  const m = await backupInstance(loadConfig(), values.out);
  console.log(`Backup written to ${values.out}: ${m.engine} database at migration ${m.migrationLevel}, ${m.counts.releases} releases, ${m.objects.length} objects (${m.counts.objectBytes} bytes).`);
} catch (e) {
  console.error((e as Error).message);
  process.exit(1);
}
