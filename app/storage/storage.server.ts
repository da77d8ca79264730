import { env } from "~/config/env.server";
import { createS3Storage, type ObjectStorage } from "./s3";

export type { ObjectStorage };

/** The instance's object storage: the local fake in development, real S3 by configuration. */
export const storage: ObjectStorage = createS3Storage({
  endpoint: env.S3_ENDPOINT,
  region: env.S3_REGION,
  bucket: env.S3_BUCKET,
  accessKeyId: env.S3_ACCESS_KEY_ID,
  secretAccessKey: env.S3_SECRET_ACCESS_KEY,
  forcePathStyle: env.S3_FORCE_PATH_STYLE,
});
