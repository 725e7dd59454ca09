"use client";
import Link from "next/link";
import { usePathname } from "next/navigation";
import { cx, PendingLinkHint } from "@/components/ui";

const LINKS = [
  { href: "/projects", label: "Projects" },
  { href: "/members", label: "Members" },
  { href: "/billing", label: "Billing" },
  { href: "/settings/api-keys", label: "API keys" },
  { href: "/account", label: "Account" },
];

export function StudioNav() {
  const pathname = usePathname();
  return (
    <nav aria-label="Studio" className="flex gap-1">
      {LINKS.map((l) => {
        const active = pathname === l.href || pathname.startsWith(`${l.href}/`);
        return (
          <Link
            key={l.href}
            href={l.href}
            aria-current={active ? "page" : undefined}
            className={cx(
              "rounded px-3 py-1.5 text-sm",
              active ? "bg-copper/10 font-medium text-copper" : "text-ink-muted hover:text-ink",
            )}
          >
            {l.label}
            <PendingLinkHint />
          </Link>
        );
      })}
    </nav>
  );
}
