"use client";
import { Alert, Button } from "@/components/ui";

export default function StudioError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <Alert tone="error" title="This page could not be shown" action={<Button size="sm" variant="secondary" onClick={reset}>Try again</Button>}>
      Something went wrong while loading it. Your data is safe; try again in a moment.
    </Alert>
  );
}
