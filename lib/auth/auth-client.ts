// better-auth in the browser: sign-in, sign-out, password reset.
"use client";
import { createAuthClient } from "better-auth/react";

export const authClient = createAuthClient();
