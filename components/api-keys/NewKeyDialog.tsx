"use client";
import { useRef, useState } from "react";
import { Alert, Button, Dialog } from "@/components/ui";

/** Shows a newly created key once, with a copy button. */
export function NewKeyDialog({ keyText, keyName, onClose }: { keyText: string | null; keyName: string; onClose: () => void }) {
  const [copied, setCopied] = useState<"yes" | "failed" | null>(null);
  const ref = useRef<HTMLInputElement>(null);

  async function copy() {
    if (!keyText) return;
    try {
      await navigator.clipboard.writeText(keyText);
      setCopied("yes");
    } catch {
      // no clipboard permission: select the text so Ctrl+C works
      ref.current?.select();
      setCopied("failed");
    }
  }

  return (
    <Dialog
      open={keyText !== null}
      onClose={() => {
        setCopied(null);
        onClose();
      }}
      title="Your new API key"
      description={keyName}
      footer={<Button onClick={() => { setCopied(null); onClose(); }}>I have saved the key</Button>}
    >
      <div className="space-y-4">
        <Alert tone="info" title="Copy it now">
          This is the only time Tapernote shows this key. It keeps only a fingerprint of it, so the key cannot be shown again. Keep it
          where you keep passwords; if it is lost, revoke it and create a new one.
        </Alert>
        <div className="flex gap-2">
          <input
            ref={ref}
            readOnly
            value={keyText ?? ""}
            aria-label="The new API key"
            data-testid="new-api-key"
            onFocus={(e) => e.currentTarget.select()}
            className="h-10 min-w-0 flex-1 rounded-md border border-rule bg-paper px-3 font-mono text-sm text-ink"
          />
          <Button variant="secondary" onClick={copy} data-autofocus="">
            {copied === "yes" ? "Copied" : "Copy"}
          </Button>
        </div>
        {copied === "failed" ? <p className="text-sm text-ink-muted">The browser did not allow copying; the key is selected, press Ctrl+C (⌘C).</p> : null}
        <p className="text-sm text-ink-muted">
          Send it with each request as <code className="rounded bg-paper px-1 py-0.5 text-[0.8125rem]">Authorization: Bearer &lt;key&gt;</code>.
        </p>
      </div>
    </Dialog>
  );
}
