/**
 * Bounds of one import of many runs (documented on the runs page and in docs/api.md): enough for
 * a paper's parameter survey, small enough that one request validates everything before writing.
 */
export const BULK_LIMITS = {
  /** Files in one import. */
  files: 50,
  /** Run records in one import (all files together). */
  records: 200,
  /** Bytes of one file. */
  fileBytes: 1024 * 1024,
  /** Bytes of all files together. */
  totalBytes: 5 * 1024 * 1024,
} as const;
