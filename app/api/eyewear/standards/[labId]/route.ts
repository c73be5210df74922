import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { labStandardInput, setLabStandard } from "@/lib/server/eyewear";

/** An admin or safety officer picks the standard a lab's hazard figures follow. */
export const PUT = apiRoute<{ labId: string }>({ standard: ["set"] }, async ({ request, actor, params }) => {
  const input = parseWith(labStandardInput, await readJson(request), "The lab's standard");
  return setLabStandard(getDb(), actor, params.labId, input);
});
