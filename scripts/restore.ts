// `npm run restore -- --from <folder>`: rebuilds an empty instance from a backup (see server/backup/).
import { parseArgs } from 'node:util';
import { loadConfig } from '../server/config';
import { restoreInstance } from '../server/backup/restore-backup';

const { values } = parseArgs({ options: { from: { type: 'string' } } });
if (!values.from) {
  console.error('Usage: npm run restore -- --from <folder>');
  process.exit(2);
}
try {
  const m = await restoreInstance(loadConfig(), values.from);
  console.log(`Restored the backup of ${m.createdAt}: ${m.counts.releases} releases, ${m.objects.length} objects. Start Cohesia to use it.`);
} catch (e) {
  console.error((e as Error).message);
  process.exit(1);
}
