import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { SignUpForm } from "@/components/auth/SignUpForm";
import { optionalPageActor } from "@/lib/auth/page";
import { isProductionEnv } from "@/lib/env";

export const metadata: Metadata = { title: "Create an account" };

export default async function SignUpPage() {
  if (await optionalPageActor()) redirect("/projects");
  return <SignUpForm showDevMailbox={!isProductionEnv()} />;
}
