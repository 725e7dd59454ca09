import Link from "next/link";
import type { ReactNode } from "react";
import { SignOutButton } from "@/components/auth/SignOutButton";
import { StudioNav } from "@/components/studio/StudioNav";
import { StudioSwitcher } from "@/components/studio/StudioSwitcher";
import { RoleBadge } from "@/components/ui";
import { requirePageActor } from "@/lib/auth/page";

export default async function StudioLayout({ children }: { children: ReactNode }) {
  const actor = await requirePageActor("/projects");
  return (
    <div className="min-h-screen">
      <header className="border-b border-rule bg-surface/80">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
          <Link href="/projects" className="text-lg font-semibold tracking-tight">Tapernote</Link>
          <StudioNav />
          <div className="ml-auto flex items-center gap-3">
            {actor.studioId ? (
              <>
                <StudioSwitcher
                  activeId={actor.studioId}
                  studios={actor.memberships.map((m) => ({ id: m.studioId, name: m.studioName, role: m.role }))}
                />
                <RoleBadge role={actor.role} />
              </>
            ) : null}
            <span className="hidden text-sm text-ink-muted sm:inline" title={actor.user.email}>{actor.user.name}</span>
            <SignOutButton />
          </div>
        </div>
      </header>
      <main className="mx-auto max-w-6xl px-4 py-8">{children}</main>
    </div>
  );
}
