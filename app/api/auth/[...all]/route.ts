import { handleAuthRequest } from "@/lib/auth/handler";

// better-auth's endpoints, only those the product uses (lib/auth/endpoints.ts); the instance is
// created on the first request, so the build needs no environment.
export const GET = handleAuthRequest;
export const POST = handleAuthRequest;
