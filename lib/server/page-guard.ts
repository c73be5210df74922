// Pages use the same authorization helper as routes; a page only adds the redirect to sign-in
// and shows the refusal as a page (production hides thrown messages, so we return it instead).
import "server-only";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import type { Permission } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { authorize, currentActor, type Actor } from "./authorize";

export async function pageActor(): Promise<Actor> {
  const actor = await currentActor();
  if (!actor) {
    // back to the page asked for after signing in (the proxy passes its path; the sign-in form keeps only same-site paths)
    const path = (await headers()).get("x-benchwarden-path");
    redirect(path && path.startsWith("/") && !path.startsWith("//") && path !== "/" ? `/sign-in?callbackURL=${encodeURIComponent(path)}` : "/sign-in");
  }
  return actor;
}

/** The sentence explaining why the actor may not do this, or null when allowed. */
export function refusal(actor: Actor, permission: Permission): string | null {
  try {
    authorize(actor, permission);
    return null;
  } catch (error) {
    if (error instanceof AppError) return error.message;
    throw error;
  }
}
