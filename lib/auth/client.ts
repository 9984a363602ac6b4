"use client";
import { createAuthClient } from "better-auth/react";

/** Browser-side sign-in, sign-out and session; same origin as the page. */
export const authClient = createAuthClient();
