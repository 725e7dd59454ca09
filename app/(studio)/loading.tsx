import { Spinner } from "@/components/ui";

export default function StudioLoading() {
  return (
    <div className="flex items-center gap-3 py-16 text-ink-muted" role="status">
      <Spinner /> Loading…
    </div>
  );
}
