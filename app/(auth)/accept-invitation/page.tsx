import { AcceptInvitationForm } from "@/components/auth/accept-invitation-form";

export const metadata = { title: "Accept invitation" };

export default async function AcceptInvitationPage({ searchParams }: { searchParams: Promise<{ token?: string }> }) {
  const { token } = await searchParams;
  if (!token) return <p role="alert">This invitation link is incomplete. Open the link from the e-mail again.</p>;
  return <AcceptInvitationForm token={token} />;
}
