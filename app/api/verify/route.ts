import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { verifyInput, verifySheetHash } from "@/lib/server/sheet-verification";

// Verify a printed sheet by its content hash (GET ?hash=… or POST { hash }); bench:read or audit:read is checked inside.
export const GET = apiRoute(null, async ({ request, actor }) => {
  const input = parseWith(verifyInput, { hash: new URL(request.url).searchParams.get("hash") ?? undefined }, "The verification");
  return verifySheetHash(getDb(), actor, input);
});

export const POST = apiRoute(null, async ({ request, actor }) => {
  const input = parseWith(verifyInput, await readJson(request), "The verification");
  return verifySheetHash(getDb(), actor, input);
});
