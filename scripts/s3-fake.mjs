// The local S3-compatible store (s3rver) on loopback, for npm start and npm test only.
// Usage: node scripts/s3-fake.mjs <port> <directory> <bucket>
import S3rver from 's3rver';

const [port, directory, bucket] = process.argv.slice(2);
const server = new S3rver({ port: Number(port), address: '127.0.0.1', directory, silent: true, configureBuckets: [{ name: bucket }] });
await server.run();
console.log(`s3 fake listening on 127.0.0.1:${port}, bucket ${bucket}`);
const stop = () => server.close(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
