// The storage module's one interface: bytes kept under a key. Two adapters implement it (local disk,
// S3-compatible object storage); callers never know which one they hold.
export interface ObjectStore {
  /** Where the bytes go, for logs and the start-up line ("local disk at …", "S3 bucket … at …"). */
  readonly description: string;
  put(key: string, body: Buffer, contentType?: string): Promise<void>;
  /** The bytes, or null when nothing is stored under the key. */
  get(key: string): Promise<Buffer | null>;
  /** Removes the object; removing a missing key is not an error. */
  delete(key: string): Promise<void>;
  exists(key: string): Promise<boolean>;
}

/** Keys are relative paths of plain segments: letters, digits, '.', '_', '-' and '/' between segments. */
const KEY = /^[A-Za-z0-9_-][A-Za-z0-9._-]*(\/[A-Za-z0-9_-][A-Za-z0-9._-]*)*$/;

export function assertKey(key: string): void {
  if (key.length === 0 || key.length > 512 || !KEY.test(key) || key.split("/").some((s) => s === "." || s === "..")) {
    throw new RangeError(`Storage key "${key}" is not a plain relative path`);
  }
}
