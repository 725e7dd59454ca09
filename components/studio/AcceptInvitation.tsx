"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Alert, Button } from "@/components/ui";
import { apiFetch } from "@/lib/client/api";

export function AcceptInvitation({ token }: { token: string }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  return (
    <div className="space-y-3">
      {error ? <Alert tone="error">{error}</Alert> : null}
      <Button
        loading={busy}
        onClick={async () => {
          setBusy(true);
          setError(null);
          try {
            await apiFetch("/api/v1/invitations/accept", { method: "POST", json: { token } });
            router.replace("/projects");
            router.refresh();
          } catch (e) {
            setError(e instanceof Error ? e.message : "The invitation could not be accepted.");
            setBusy(false);
          }
        }}
      >
        Accept and join
      </Button>
    </div>
  );
}
