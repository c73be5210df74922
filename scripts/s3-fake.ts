// A stand-in for S3-compatible object storage, for tests only (s3rver on loopback): `npm test` runs
// both app servers with STORAGE_DRIVER=s3 against it, so an upload or a build sheet stored through
// one server is read through the other, as with an institution's shared object storage.
import { mkdirSync } from "node:fs";
import S3rver from "s3rver";

const port = Number(process.env.S3_FAKE_PORT ?? 3193);
const directory = process.env.S3_FAKE_DIR ?? ".data/test/s3";
const bucket = process.env.S3_BUCKET ?? "benchwarden";
mkdirSync(directory, { recursive: true });

const server = new S3rver({ address: "127.0.0.1", port, silent: true, directory, configureBuckets: [{ name: bucket, configs: [] }] });
server.run((error) => {
  if (error) {
    console.error(`[s3 fake] cannot start: ${error.message}`);
    process.exit(1);
  }
  console.log(`[s3 fake] http://127.0.0.1:${port}, bucket ${bucket}, files in ${directory}`);
});
const stop = () => void server.close().then(() => process.exit(0));
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
