// Local S3-compatible object store for development and tests. The app talks to it
// only through @aws-sdk/client-s3, so a real S3 endpoint is a configuration change.
import S3rver from "s3rver";

const port = Number(process.env.S3_PORT_LOCAL ?? 45690);
const directory = process.env.S3_LOCAL_DIR ?? "local-s3/dev";
const bucket = process.env.S3_BUCKET ?? "bandkeep-dev";

const server = new S3rver({
  address: "127.0.0.1",
  port,
  silent: true,
  directory,
  configureBuckets: [{ name: bucket, configs: [] }],
});

await server.run();
console.log(`storage fake on 127.0.0.1:${port}, bucket ${bucket}, directory ${directory}`);

for (const signal of ["SIGTERM", "SIGINT"] as const) {
  process.on(signal, () => {
    server.close().finally(() => process.exit(0));
  });
}
