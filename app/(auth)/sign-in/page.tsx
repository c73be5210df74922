import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { Suspense } from "react";
import { SignInForm } from "@/components/auth/sign-in-form";
import { ssoSettings } from "@/lib/auth/sso";
import { currentActor } from "@/lib/server/authorize";

export const metadata: Metadata = { title: "Sign in" };
export const dynamic = "force-dynamic";

export default async function SignInPage() {
  if (await currentActor()) redirect("/");
  return (
    <Suspense>
      <SignInForm institution={ssoSettings()?.label ?? null} />
    </Suspense>
  );
}
