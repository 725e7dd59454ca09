import type { Metadata } from "next";
import { headers } from "next/headers";
import type { ReactNode } from "react";
import { plexMono, plexSans } from "./fonts";
import { Providers } from "@/components/providers";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Tapernote", template: "%s · Tapernote" },
  description: "Tapernote turns recordings of music into notes with their timing, loudness and tuning in cents.",
};

export default async function RootLayout({ children }: { children: ReactNode }) {
  // Reading the request's nonce renders every page per request, so Next.js can put the
  // CSP nonce (set in proxy.ts) on its scripts.
  (await headers()).get("x-nonce");
  return (
    <html lang="en" className={`${plexSans.variable} ${plexMono.variable}`}>
      <body className="min-h-screen bg-paper font-sans text-ink antialiased">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
