import { env } from "~/config/env.server";
import { createS3Storage, s3SettingsFromEnv, type ObjectStorage } from "./s3";

export type { ObjectStorage };

/** The instance's object storage: the local fake in development, real S3 by configuration. */
export const storage: ObjectStorage = createS3Storage(s3SettingsFromEnv(env));
