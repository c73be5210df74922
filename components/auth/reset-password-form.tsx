"use client";
import { authClient } from "@/lib/auth/auth-client";
import { NewPasswordForm } from "./new-password-form";

export function ResetPasswordForm({ token }: { token: string }) {
  return (
    <NewPasswordForm
      title="Choose a new password"
      submit={async (newPassword) => {
        const { error } = await authClient.resetPassword({ newPassword, token });
        return error ? "This link has expired or was already used. Ask for a new one." : null;
      }}
    />
  );
}
