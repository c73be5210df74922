// Local-disk adapter of the storage module: each key is a file under one directory (default .data/uploads).
// Writes go to a temporary file first and are renamed into place, so a reader never sees half a file.
import { randomUUID } from "node:crypto";
import { mkdir, readFile, rename, rm, stat, writeFile } from "node:fs/promises";
import path from "node:path";
import { assertKey, type ObjectStore } from "./types";

export class LocalStore implements ObjectStore {
  readonly description: string;
  private readonly root: string;

  constructor(directory: string) {
    this.root = path.resolve(directory);
    this.description = `local disk at ${this.root}`;
  }

  private file(key: string): string {
    assertKey(key);
    return path.join(this.root, ...key.split("/"));
  }

  async put(key: string, body: Buffer): Promise<void> {
    const target = this.file(key);
    await mkdir(path.dirname(target), { recursive: true });
    const temporary = `${target}.${randomUUID()}.part`;
    await writeFile(temporary, body);
    await rename(temporary, target);
  }

  async get(key: string): Promise<Buffer | null> {
    try {
      return await readFile(this.file(key));
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code === "ENOENT") return null;
      throw error;
    }
  }

  async delete(key: string): Promise<void> {
    await rm(this.file(key), { force: true });
  }

  async exists(key: string): Promise<boolean> {
    try {
      return (await stat(this.file(key))).isFile();
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code === "ENOENT") return false;
      throw error;
    }
  }
}
