// The storage module: put/get/delete/exists by key, on local disk (the default, .data/uploads) or in
// S3-compatible object storage, chosen by STORAGE_DRIVER. Uploads and build-sheet PDFs live here.
import path from "node:path";
import { env } from "@/lib/env";
import { LocalStore } from "./local";
import { S3Store } from "./s3";
import type { ObjectStore } from "./types";

export type { ObjectStore } from "./types";
export { assertKey } from "./types";
export { LocalStore } from "./local";
export { S3Store, type S3StoreConfig } from "./s3";

export const DEFAULT_STORAGE_DIR = ".data/uploads";

type StorageSettings = {
  STORAGE_DRIVER?: "local" | "s3";
  STORAGE_DIR?: string;
  S3_ENDPOINT?: string;
  S3_BUCKET?: string;
  S3_ACCESS_KEY_ID?: string;
  S3_SECRET_ACCESS_KEY?: string;
  S3_REGION?: string;
};

/** An adapter for the given settings (the environment's names). */
export function createStorage(settings: StorageSettings): ObjectStore {
  if (settings.STORAGE_DRIVER === "s3") {
    if (!settings.S3_BUCKET) throw new Error("STORAGE_DRIVER is s3 but S3_BUCKET is not set: name the bucket that keeps uploads and build sheets");
    return new S3Store({
      bucket: settings.S3_BUCKET,
      endpoint: settings.S3_ENDPOINT,
      region: settings.S3_REGION ?? "us-east-1",
      accessKeyId: settings.S3_ACCESS_KEY_ID,
      secretAccessKey: settings.S3_SECRET_ACCESS_KEY,
    });
  }
  return new LocalStore(path.resolve(process.cwd(), settings.STORAGE_DIR ?? DEFAULT_STORAGE_DIR));
}

const globalForStorage = globalThis as unknown as { benchwardenStorage?: ObjectStore };

/** The app's one store, built from the environment on first use. */
export function storage(): ObjectStore {
  globalForStorage.benchwardenStorage ??= createStorage(env());
  return globalForStorage.benchwardenStorage;
}
