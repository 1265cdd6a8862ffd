// `npm run reset`: wipes the embedded data folder (database, objects, mail).
import fs from 'node:fs';
import path from 'node:path';
import { loadConfig } from '../server/config';
import { lockDataDir } from '../server/db/data-dir-lock';

const config = loadConfig();
const dir = path.resolve(config.dataDir);
if (!fs.existsSync(dir)) {
  console.log(`Nothing to reset: ${dir} does not exist.`);
  process.exit(0);
}
try {
  // Refuse while a running Cohesia holds the folder.
  lockDataDir(dir).release();
} catch (e) {
  console.error((e as Error).message);
  process.exit(1);
}
for (const entry of fs.readdirSync(dir)) {
  // Benchmark inputs are costly to regenerate and hold no user data; backups are what a reset must not take.
  if (entry === 'bench' || entry === 'backups') continue;
  fs.rmSync(path.join(dir, entry), { recursive: true, force: true });
}
console.log(`Reset ${dir}: the next start seeds the demo data again (backups/ and bench/ were kept).`);
