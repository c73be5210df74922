"use client";
import { apiFetch, ApiError, checkBeforeSending } from "@/lib/api/client";
import { acceptInput } from "@/lib/api/contracts/people";
import { NewPasswordForm } from "./new-password-form";

export function AcceptInvitationForm({ token }: { token: string }) {
  return (
    <NewPasswordForm
      title="Welcome — choose your password"
      submit={async (password) => {
        try {
          await apiFetch("/api/invitations/accept", { method: "POST", body: JSON.stringify(checkBeforeSending(acceptInput, { token, password })) });
          return null;
        } catch (error) {
          return error instanceof ApiError ? error.message : "The invitation could not be accepted.";
        }
      }}
    />
  );
}
