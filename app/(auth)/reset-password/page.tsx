import { ResetPasswordForm } from "@/components/auth/reset-password-form";

export const metadata = { title: "New password" };

export default async function ResetPasswordPage({ searchParams }: { searchParams: Promise<{ token?: string; error?: string }> }) {
  const { token, error } = await searchParams;
  if (!token || error) return <p role="alert">This link has expired or was already used. <a href="/forgot-password">Ask for a new one.</a></p>;
  return <ResetPasswordForm token={token} />;
}
