"use client";
import { useEffect, useState } from "react";

const STORAGE_KEY = "tapernote.upload-consent";

/** Whether the person confirmed the consent notice in this browser session. */
export function useUploadConsent(): [boolean, (value: boolean) => void] {
  const [confirmed, setConfirmed] = useState(false);
  useEffect(() => {
    try {
      // sessionStorage is only there in the browser: read it after the first render
      if (window.sessionStorage.getItem(STORAGE_KEY) === "yes") setConfirmed(true);
    } catch {
      // storage turned off: ask again on each page
    }
  }, []);
  const set = (value: boolean) => {
    setConfirmed(value);
    try {
      if (value) window.sessionStorage.setItem(STORAGE_KEY, "yes");
      else window.sessionStorage.removeItem(STORAGE_KEY);
    } catch {
      // ignore
    }
  };
  return [confirmed, set];
}

/** The personal-data notice shown before the first upload; files wait until it is confirmed. */
export function ConsentNotice({ confirmed, onChange }: { confirmed: boolean; onChange: (value: boolean) => void }) {
  return (
    <div
      className="rounded-md border border-l-[3px] border-voice-slate/45 bg-voice-slate/[0.07] px-4 py-3 text-sm"
      aria-labelledby="consent-title"
      role="group"
    >
      <p id="consent-title" className="font-semibold text-ink">Before you upload</p>
      <ul className="mt-1 list-disc space-y-0.5 pl-5 text-ink/90">
        <li>Recordings of students are personal data. Upload them only with the student’s consent, or their parent’s or guardian’s for a child.</li>
        <li>The studio can delete a take for good at any time: its audio, its analyses and its notes.</li>
        <li>The data-protection rules of your country or region apply to what you upload.</li>
      </ul>
      <label className="mt-3 flex items-start gap-2.5 font-medium text-ink">
        <input
          type="checkbox"
          className="mt-0.5 size-4 shrink-0 accent-copper"
          checked={confirmed}
          onChange={(e) => onChange(e.target.checked)}
        />
        <span>I have the consent needed for these recordings.</span>
      </label>
      <p className="mt-1 pl-6.5 text-xs text-ink-muted">Remembered until you close this browser tab.</p>
    </div>
  );
}
