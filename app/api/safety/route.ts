import { beamInputSchema, assessBeam } from "@/lib/safety";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";

/** The hazard figures of one continuous-wave or pulsed beam, as a datasheet describes it. */
export const POST = apiRoute({ analysis: ["run"] }, async ({ request }) => assessBeam(parseWith(beamInputSchema, await readJson(request), "The beam")));
