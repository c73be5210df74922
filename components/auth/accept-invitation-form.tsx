"use client";
import { apiFetch, ApiError } from "@/lib/api/client";
import { NewPasswordForm } from "./new-password-form";

export function AcceptInvitationForm({ token }: { token: string }) {
  return (
    <NewPasswordForm
      title="Welcome — choose your password"
      submit={async (password) => {
        try {
          await apiFetch("/api/invitations/accept", { method: "POST", body: JSON.stringify({ token, password }) });
          return null;
        } catch (error) {
          return error instanceof ApiError ? error.message : "The invitation could not be accepted.";
        }
      }}
    />
  );
}
