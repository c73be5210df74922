// Runs once when the Next.js server starts (Node.js runtime only).
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { stampPeerAddresses } = await import("./lib/auth/peer-address");
  stampPeerAddresses();
}
