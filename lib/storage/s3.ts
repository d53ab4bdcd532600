import 'server-only';
import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';

// The object store of the photos, configured from the environment so that a real bucket works
// unchanged: S3_ENDPOINT (empty for AWS itself), S3_REGION, S3_BUCKET, S3_ACCESS_KEY_ID,
// S3_SECRET_ACCESS_KEY, S3_FORCE_PATH_STYLE. `npm start` and `npm test` run a local fake
// (scripts/fakes.mjs) and set them.

export interface StorageConfig {
  endpoint: string | undefined;
  region: string;
  bucket: string;
  accessKeyId: string | undefined;
  secretAccessKey: string | undefined;
  forcePathStyle: boolean;
}

export function storageConfig(env: Record<string, string | undefined> = process.env): StorageConfig {
  return {
    endpoint: env.S3_ENDPOINT || undefined,
    region: env.S3_REGION || 'us-east-1',
    bucket: env.S3_BUCKET || 'proving-ground',
    accessKeyId: env.S3_ACCESS_KEY_ID || undefined,
    secretAccessKey: env.S3_SECRET_ACCESS_KEY || undefined,
    forcePathStyle: env.S3_FORCE_PATH_STYLE === 'true',
  };
}

let cached: { client: S3Client; config: StorageConfig } | null = null;

function store(): { client: S3Client; config: StorageConfig } {
  if (cached) return cached;
  const config = storageConfig();
  const client = new S3Client({
    endpoint: config.endpoint,
    region: config.region,
    forcePathStyle: config.forcePathStyle,
    credentials:
      config.accessKeyId && config.secretAccessKey
        ? { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey }
        : undefined,
    // Otherwise a PutObject is sent aws-chunked, which S3-compatible fakes store with its framing.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  cached = { client, config };
  return cached;
}

export async function putObject(key: string, body: Buffer, contentType: string): Promise<void> {
  const { client, config } = store();
  await client.send(
    new PutObjectCommand({ Bucket: config.bucket, Key: key, Body: body, ContentType: contentType, ContentLength: body.length }),
  );
}

export async function getObject(key: string): Promise<Buffer> {
  const { client, config } = store();
  const res = await client.send(new GetObjectCommand({ Bucket: config.bucket, Key: key }));
  return Buffer.from(await res.Body!.transformToByteArray());
}

export async function deleteObject(key: string): Promise<void> {
  const { client, config } = store();
  await client.send(new DeleteObjectCommand({ Bucket: config.bucket, Key: key }));
}

/** How long a signed link to a photo works. */
export const SIGNED_URL_SECONDS = 300;

/** A short-lived signed GET link to the object. */
export async function signedGetUrl(key: string, seconds = SIGNED_URL_SECONDS): Promise<string> {
  const { client, config } = store();
  return getSignedUrl(client, new GetObjectCommand({ Bucket: config.bucket, Key: key }), { expiresIn: seconds });
}
