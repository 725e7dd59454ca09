import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { SignInForm } from "@/components/auth/SignInForm";
import { optionalPageActor, safeNext } from "@/lib/auth/page";

export const metadata: Metadata = { title: "Sign in" };

const NOTICES: Record<string, string> = {
  reset: "Your password has been changed. Sign in with the new one.",
  verified: "Your e-mail address is confirmed. Sign in to continue.",
};

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const params = await searchParams;
  const next = safeNext(params.next);
  if (await optionalPageActor()) redirect(next);
  const notice = typeof params.notice === "string" ? NOTICES[params.notice] : undefined;
  return <SignInForm next={next} notice={notice} />;
}
