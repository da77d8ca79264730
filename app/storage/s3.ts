import { DeleteObjectCommand, GetObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { Upload } from "@aws-sdk/lib-storage";
import type { Readable } from "node:stream";

export type S3Settings = {
  endpoint: string;
  region: string;
  bucket: string;
  accessKeyId: string;
  secretAccessKey: string;
  forcePathStyle: boolean;
};

export type ObjectStorage = {
  /** Streams the body up in parts; the length need not be known in advance. */
  put(key: string, body: Readable | Uint8Array | string, contentType: string): Promise<void>;
  getBytes(key: string): Promise<Uint8Array>;
  getStream(key: string): Promise<ReadableStream<Uint8Array>>;
  remove(key: string): Promise<void>;
};

/** The S3 settings of a validated configuration (server and seed read the same variables). */
export function s3SettingsFromEnv(env: {
  S3_ENDPOINT: string;
  S3_REGION: string;
  S3_BUCKET: string;
  S3_ACCESS_KEY_ID: string;
  S3_SECRET_ACCESS_KEY: string;
  S3_FORCE_PATH_STYLE: boolean;
}): S3Settings {
  return {
    endpoint: env.S3_ENDPOINT,
    region: env.S3_REGION,
    bucket: env.S3_BUCKET,
    accessKeyId: env.S3_ACCESS_KEY_ID,
    secretAccessKey: env.S3_SECRET_ACCESS_KEY,
    forcePathStyle: env.S3_FORCE_PATH_STYLE,
  };
}

export function createS3Storage(settings: S3Settings): ObjectStorage {
  const client = new S3Client({
    endpoint: settings.endpoint,
    region: settings.region,
    forcePathStyle: settings.forcePathStyle,
    credentials: { accessKeyId: settings.accessKeyId, secretAccessKey: settings.secretAccessKey },
  });
  const Bucket = settings.bucket;
  const get = async (key: string) => {
    const out = await client.send(new GetObjectCommand({ Bucket, Key: key }));
    if (!out.Body) throw new Error(`Stored object ${key} has no body.`);
    return out.Body;
  };
  return {
    async put(key, body, contentType) {
      await new Upload({ client, params: { Bucket, Key: key, Body: body, ContentType: contentType } }).done();
    },
    async getBytes(key) {
      return (await get(key)).transformToByteArray();
    },
    async getStream(key) {
      return (await get(key)).transformToWebStream();
    },
    async remove(key) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: key }));
    },
  };
}
