// Files kept with an as-built record (bench and screen photos, datasheets): checked by their first bytes,
// stored through lib/storage, recorded with an audit row; the bytes are removed again if the row is not written.
import "server-only";
import { createHash, randomUUID } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { z } from "zod";
import type { Database } from "@/db";
import { upload, type UploadKind } from "@/db/schema";
import { AppError, notFound } from "@/lib/errors";
import { storage } from "@/lib/storage";
import { recordAudit } from "./audit";
import { authorize, type Actor } from "./authorize";
import { safeFileName, assertUploadSize, sniffFileType } from "@/lib/build/rules";
import type { BuildView, UploadView } from "@/lib/api/contracts/builds";

import { aboutRevision, assertRecordable, loadBuild } from "./builds";
import { buildView } from "./build-views";

export async function addUpload(
  db: Database,
  actor: Actor,
  buildId: string,
  input: { kind: UploadKind; fileName: string; bytes: Buffer },
): Promise<{ upload: UploadView; build: BuildView }> {
  authorize(actor, { build: ["record"] });
  const { build, revision } = await loadBuild(db, actor, buildId);
  assertRecordable(build, revision);
  if (input.bytes.length === 0) throw new AppError("bad-request", "The file is empty.", [{ path: "file", message: "Choose a file" }]);
  assertUploadSize(input.bytes.length);
  const type = sniffFileType(input.bytes);
  if (!type) {
    throw new AppError("bad-request", `"${input.fileName}" is not a PNG, JPEG or PDF file (its content says otherwise, whatever its name). Only PNG and JPEG photos and PDF datasheets can be kept.`, [
      { path: "file", message: "Only PNG, JPEG or PDF" },
    ]);
  }
  const id = randomUUID();
  const sha256 = createHash("sha256").update(input.bytes).digest("hex");
  const key = `uploads/${build.id}/${id}.${type.extension}`;
  const fileName = safeFileName(input.fileName, type.extension);
  const store = storage();
  await store.put(key, input.bytes, type.contentType);
  try {
    return await db.transaction(async (tx) => {
      const { build: locked } = await loadBuild(tx, actor, buildId, true);
      assertRecordable(locked, revision);
      const [row] = await tx
        .insert(upload)
        .values({ id, buildId: build.id, kind: input.kind, fileName, contentType: type.contentType, sizeBytes: input.bytes.length, sha256, storageKey: key, uploadedBy: actor.userId })
        .returning();
      await recordAudit(tx, actor, {
        ...aboutRevision(revision),
        action: "build-upload-stored",
        detail: { buildId: build.id, uploadId: id, kind: input.kind, fileName, contentType: type.contentType, sizeBytes: input.bytes.length, sha256 },
      });
      const view = await buildView(tx, actor, locked, revision);
      return { upload: view.uploads.find((u) => u.id === row.id)!, build: view };
    });
  } catch (error) {
    await store.delete(key).catch(() => undefined); // nothing is kept without its row
    throw error;
  }
}

/** The stored bytes of one upload, for showing beside the prediction. */
export async function readUpload(db: Database, actor: Actor, buildId: string, uploadId: string): Promise<{ bytes: Buffer; contentType: string; fileName: string; sha256: string }> {
  authorize(actor, { build: ["read"] });
  const { build } = await loadBuild(db, actor, buildId);
  if (!z.uuid().safeParse(uploadId).success) throw notFound("The file");
  const [row] = await db.select().from(upload).where(and(eq(upload.id, uploadId), eq(upload.buildId, build.id)));
  if (!row) throw notFound("The file");
  const bytes = await storage().get(row.storageKey);
  if (!bytes) throw new AppError("not-found", "The file's record exists but its content is missing from storage; tell your administrator.");
  return { bytes, contentType: row.contentType, fileName: row.fileName, sha256: row.sha256 };
}

