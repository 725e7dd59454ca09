import { auth } from "@/lib/auth/auth";

// better-auth's handler, nothing else.
export const GET = (request: Request) => auth().handler(request);
export const POST = (request: Request) => auth().handler(request);
