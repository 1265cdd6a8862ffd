// Starts the object-storage fake alone: `npm run fake:storage`.
import { loadConfig } from '../../server/config';
import { startObjectStorage } from './server';

const config = loadConfig();
const fake = await startObjectStorage({
  port: Number(new URL(config.s3.endpoint).port),
  directory: `${config.dataDir}/s3`,
  bucket: config.s3.bucket,
});
console.log(`Object storage (S3-compatible) at ${fake.url}, bucket "${config.s3.bucket}"`);
process.on('SIGINT', () => void fake.close().then(() => process.exit(0)));
