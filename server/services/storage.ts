// Object storage through the AWS SDK: s3rver locally, any S3 endpoint in production.
import {
  S3Client,
  PutObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  HeadObjectCommand,
  CreateBucketCommand,
  DeleteObjectCommand,
} from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import type { Readable } from 'node:stream';

// The SDK prints a notice on every start that its releases after January 2027 need Node 22. The
// project runs Node 20 with the SDK version pinned in the lock file (DEVELOPERS.md), so the notice
// tells the user nothing they can act on; it is turned off unless asked for.
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';

export type Storage = {
  bucket: string;
  put(key: string, body: Buffer | Readable, contentType?: string, contentLength?: number): Promise<void>;
  get(key: string): Promise<Buffer>;
  exists(key: string): Promise<boolean>;
  remove(key: string): Promise<void>;
  presignedGetUrl(key: string, filename: string, expiresSeconds?: number): Promise<string>;
  ensureBucket(): Promise<void>;
  check(): Promise<void>;
};

export function createStorage(opts: {
  endpoint: string;
  bucket: string;
  region: string;
  accessKeyId: string;
  secretAccessKey: string;
}): Storage {
  const client = new S3Client({
    endpoint: opts.endpoint,
    region: opts.region,
    forcePathStyle: true,
    credentials: { accessKeyId: opts.accessKeyId, secretAccessKey: opts.secretAccessKey },
    maxAttempts: 2,
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  const Bucket = opts.bucket;
  return {
    bucket: Bucket,
    async put(key, body, contentType = 'application/octet-stream', contentLength) {
      await client.send(
        new PutObjectCommand({ Bucket, Key: key, Body: body, ContentType: contentType, ContentLength: contentLength }),
      );
    },
    async get(key) {
      const res = await client.send(new GetObjectCommand({ Bucket, Key: key }));
      const bytes = await res.Body!.transformToByteArray();
      return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    },
    async exists(key) {
      try {
        await client.send(new HeadObjectCommand({ Bucket, Key: key }));
        return true;
      } catch (err) {
        const status = (err as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode;
        if (status === 404) return false;
        throw err;
      }
    },
    async remove(key) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: key }));
    },
    async presignedGetUrl(key, filename, expiresSeconds = 900) {
      return getSignedUrl(
        client,
        new GetObjectCommand({
          Bucket,
          Key: key,
          ResponseContentDisposition: `attachment; filename="${filename.replace(/[^\w.-]/g, '_')}"`,
        }),
        { expiresIn: expiresSeconds },
      );
    },
    async ensureBucket() {
      try {
        await client.send(new HeadBucketCommand({ Bucket }));
      } catch {
        await client.send(new CreateBucketCommand({ Bucket }));
      }
    },
    async check() {
      await client.send(new HeadBucketCommand({ Bucket }));
    },
  };
}
