import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { eyewearInput } from "@/lib/api/contracts/eyewear";
import { createEyewear, eyewearListQuery, listEyewear } from "@/lib/server/eyewear";

/** The eyewear of the labs the caller may see, or one lab's (?labId=). */
export const GET = apiRoute({ eyewear: ["read"] }, async ({ request, actor }) => {
  const url = new URL(request.url);
  const query = parseWith(eyewearListQuery, { labId: url.searchParams.get("labId") ?? undefined }, "The eyewear query");
  return { eyewear: await listEyewear(getDb(), actor, query) };
});

/** A safety officer adds an item to a lab's shelf. */
export const POST = apiRoute({ eyewear: ["manage"] }, async ({ request, actor }) => {
  const input = parseWith(eyewearInput, await readJson(request), "The eyewear item");
  return Response.json(await createEyewear(getDb(), actor, input), { status: 201 });
});
