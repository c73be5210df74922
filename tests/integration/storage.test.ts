// The storage module's contract, run on BOTH adapters: local disk in a scratch directory, and S3 through
// @aws-sdk/client-s3 against a fake S3 server (s3rver) that this file starts on a loopback port.
import { randomBytes } from "node:crypto";
import { mkdtemp, readdir, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import S3rver from "s3rver";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createStorage, LocalStore, S3Store, type ObjectStore } from "../../lib/storage";

const BUCKET = "benchwarden-test";
const scratch: string[] = [];
let s3server: S3rver | null = null;
let s3Endpoint = "";

beforeAll(async () => {
  const dir = await mkdtemp(path.join(os.tmpdir(), "benchwarden-s3rver-"));
  scratch.push(dir);
  s3server = new S3rver({ address: "127.0.0.1", port: 0, silent: true, directory: dir, configureBuckets: [{ name: BUCKET, configs: [] }] });
  const address = await new Promise<{ port: number }>((resolve, reject) => {
    s3server!.run((error, info) => (error ? reject(error) : resolve(info)));
  });
  s3Endpoint = `http://127.0.0.1:${address.port}`;
});

afterAll(async () => {
  await s3server?.close();
  for (const dir of scratch) await rm(dir, { recursive: true, force: true });
});

type Adapter = { name: string; make: () => Promise<ObjectStore> };

const adapters: Adapter[] = [
  {
    name: "local disk",
    make: async () => {
      const dir = await mkdtemp(path.join(os.tmpdir(), "benchwarden-store-"));
      scratch.push(dir);
      return new LocalStore(dir);
    },
  },
  {
    name: "S3-compatible (s3rver)",
    make: async () => new S3Store({ bucket: BUCKET, endpoint: s3Endpoint, region: "us-east-1", accessKeyId: "S3RVER", secretAccessKey: "S3RVER" }),
  },
];

describe.each(adapters)("storage on $name", ({ make }) => {
  let store: ObjectStore;
  beforeAll(async () => {
    store = await make();
  });

  it("puts, tells it exists, gets the same bytes back", async () => {
    const key = `uploads/${randomBytes(4).toString("hex")}/photo.png`;
    const body = randomBytes(200_000);
    expect(await store.exists(key)).toBe(false);
    await store.put(key, body, "image/png");
    expect(await store.exists(key)).toBe(true);
    const back = await store.get(key);
    expect(back).not.toBeNull();
    expect(Buffer.compare(back!, body)).toBe(0);
  });

  it("answers null for a missing key, and deleting a missing key is fine", async () => {
    expect(await store.get("uploads/none/missing.pdf")).toBeNull();
    await expect(store.delete("uploads/none/missing.pdf")).resolves.toBeUndefined();
  });

  it("overwrites under the same key and deletes", async () => {
    const key = `sheets/${randomBytes(4).toString("hex")}/sheet-A4.pdf`;
    await store.put(key, Buffer.from("%PDF-first"), "application/pdf");
    await store.put(key, Buffer.from("%PDF-second"), "application/pdf");
    expect((await store.get(key))!.toString()).toBe("%PDF-second");
    await store.delete(key);
    expect(await store.exists(key)).toBe(false);
    expect(await store.get(key)).toBeNull();
  });

  it("keeps an empty object and binary content exactly", async () => {
    const key = `uploads/${randomBytes(4).toString("hex")}/empty.bin`;
    await store.put(key, Buffer.alloc(0));
    expect((await store.get(key))!.length).toBe(0);
    const bytes = Buffer.from([0, 255, 0x89, 0x50, 0x4e, 0x47, 13, 10, 26, 10]);
    await store.put(key, bytes);
    expect(Buffer.compare((await store.get(key))!, bytes)).toBe(0);
  });

  it("refuses keys that are not plain relative paths", async () => {
    for (const bad of ["../etc/passwd", "/abs/key", "a//b", "a/../b", "", "a/./b", "with space"]) {
      await expect(store.put(bad, Buffer.from("x")), bad).rejects.toThrow(/not a plain relative path/);
    }
  });
});

describe("choosing the adapter from the environment", () => {
  it("uses local disk by default, in STORAGE_DIR", async () => {
    const dir = await mkdtemp(path.join(os.tmpdir(), "benchwarden-env-"));
    scratch.push(dir);
    const store = createStorage({ STORAGE_DIR: dir });
    expect(store.description).toBe(`local disk at ${dir}`);
    await store.put("a/b.txt", Buffer.from("hello"));
    expect(await readdir(path.join(dir, "a"))).toEqual(["b.txt"]);
  });

  it("uses S3 when STORAGE_DRIVER=s3, and says what is missing without a bucket", async () => {
    const store = createStorage({ STORAGE_DRIVER: "s3", S3_BUCKET: BUCKET, S3_ENDPOINT: s3Endpoint, S3_ACCESS_KEY_ID: "S3RVER", S3_SECRET_ACCESS_KEY: "S3RVER" });
    expect(store.description).toMatch(/^S3 bucket benchwarden-test at http:\/\/127\.0\.0\.1:/);
    await store.put("env/check.txt", Buffer.from("ok"));
    expect((await store.get("env/check.txt"))!.toString()).toBe("ok");
    expect(() => createStorage({ STORAGE_DRIVER: "s3" })).toThrow(/S3_BUCKET is not set/);
  });
});
