"use client";
import { createAuthClient } from "better-auth/react";

/** better-auth's browser client, on the same origin as the app. */
export const authClient = createAuthClient();
