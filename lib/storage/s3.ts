// S3-compatible adapter of the storage module (AWS S3, MinIO, Ceph, a fake server in tests) through
// @aws-sdk/client-s3, so several app instances can share uploads and build sheets.
import { DeleteObjectCommand, GetObjectCommand, HeadObjectCommand, PutObjectCommand, S3Client, S3ServiceException } from "@aws-sdk/client-s3";
import { assertKey, type ObjectStore } from "./types";

export type S3StoreConfig = {
  bucket: string;
  /** For S3-compatible servers (path-style addressing is used then); omit for AWS itself. */
  endpoint?: string;
  region: string;
  accessKeyId?: string;
  secretAccessKey?: string;
};

function isMissing(error: unknown): boolean {
  if (error instanceof S3ServiceException) {
    return error.$metadata.httpStatusCode === 404 || error.name === "NoSuchKey" || error.name === "NotFound";
  }
  return false;
}

export class S3Store implements ObjectStore {
  readonly description: string;
  private readonly client: S3Client;
  private readonly bucket: string;

  constructor(config: S3StoreConfig) {
    this.bucket = config.bucket;
    this.description = `S3 bucket ${config.bucket}${config.endpoint ? ` at ${config.endpoint}` : ""}`;
    this.client = new S3Client({
      region: config.region,
      endpoint: config.endpoint,
      forcePathStyle: Boolean(config.endpoint),
      credentials: config.accessKeyId && config.secretAccessKey ? { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey } : undefined,
    });
  }

  async put(key: string, body: Buffer, contentType = "application/octet-stream"): Promise<void> {
    assertKey(key);
    await this.client.send(new PutObjectCommand({ Bucket: this.bucket, Key: key, Body: body, ContentType: contentType, ContentLength: body.length }));
  }

  async get(key: string): Promise<Buffer | null> {
    assertKey(key);
    try {
      const result = await this.client.send(new GetObjectCommand({ Bucket: this.bucket, Key: key }));
      if (!result.Body) return Buffer.alloc(0);
      return Buffer.from(await result.Body.transformToByteArray());
    } catch (error) {
      if (isMissing(error)) return null;
      throw error;
    }
  }

  async delete(key: string): Promise<void> {
    assertKey(key);
    await this.client.send(new DeleteObjectCommand({ Bucket: this.bucket, Key: key }));
  }

  async exists(key: string): Promise<boolean> {
    assertKey(key);
    try {
      await this.client.send(new HeadObjectCommand({ Bucket: this.bucket, Key: key }));
      return true;
    } catch (error) {
      if (isMissing(error)) return false;
      throw error;
    }
  }

  /** Closes the client's sockets (tests and shutdown). */
  destroy(): void {
    this.client.destroy();
  }
}
