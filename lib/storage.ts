import { randomUUID } from "node:crypto";
import { DeleteObjectCommand, GetObjectCommand, HeadBucketCommand, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { config } from "./config";
import { processSingleton } from "@/lib/processSingleton";

// All object storage goes through here and through @aws-sdk/client-s3 only, so a
// managed S3 endpoint is a change of environment variables.

export function s3(): S3Client {
  return processSingleton("bandkeepS3", () => {
    const c = config();
    return new S3Client({
      region: c.S3_REGION,
      endpoint: c.S3_ENDPOINT,
      forcePathStyle: c.S3_FORCE_PATH_STYLE === "true",
      credentials: { accessKeyId: c.S3_ACCESS_KEY_ID, secretAccessKey: c.S3_SECRET_ACCESS_KEY },
    });
  });
}

export { sha256Hex } from "./hash";

/** Object keys reveal neither file nor sample names. */
export function newRawObjectKey(): string {
  const id = randomUUID();
  return `raw/${id.slice(0, 2)}/${id}`;
}

export async function putObject(key: string, body: Uint8Array, contentType: string, sha256: string): Promise<void> {
  await s3().send(
    new PutObjectCommand({ Bucket: config().S3_BUCKET, Key: key, Body: body, ContentType: contentType, Metadata: { sha256 } }),
  );
}

export async function getObjectBytes(key: string): Promise<Uint8Array> {
  const res = await s3().send(new GetObjectCommand({ Bucket: config().S3_BUCKET, Key: key }));
  if (!res.Body) throw new Error(`object ${key} has no body`);
  return res.Body.transformToByteArray();
}

export async function deleteObject(key: string): Promise<void> {
  await s3().send(new DeleteObjectCommand({ Bucket: config().S3_BUCKET, Key: key }));
}

export async function storageReachable(): Promise<boolean> {
  await s3().send(new HeadBucketCommand({ Bucket: config().S3_BUCKET }));
  return true;
}
