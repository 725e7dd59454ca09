"use client";
import { Alert, Button, EmptyState, Mono, Spinner } from "@/components/ui";
import { ApiClientError } from "@/lib/client/api";
import { CommentList } from "@/components/comments/CommentList";
import { formatDuration } from "@/components/takes/format";
import { ReplayView } from "./ReplayView";
import { useSharedTake } from "./use-shared-take";

/** The replay behind a share link: read-only, comments read-only, no account. */
export function SharedReplay({ token }: { token: string }) {
  const shared = useSharedTake(token);
  if (shared.isPending) return <div className="flex items-center gap-2 text-ink-muted"><Spinner label="Loading the take" /> Loading the take…</div>;
  if (shared.isError) {
    return shared.error instanceof ApiClientError && shared.error.status === 404 ? (
      <EmptyState title="This link has expired or was withdrawn" description="Ask your teacher for a new link." />
    ) : (
      <Alert tone="error" title="The take could not be loaded" action={<Button size="sm" variant="secondary" onClick={() => shared.refetch()}>Try again</Button>}>{shared.error.message}</Alert>
    );
  }
  const { take, notes, report, comments } = shared.data;
  return (
    <ReplayView
      title={take.name}
      description={<span>Shared with you to replay · length <Mono className="text-ink">{formatDuration(take.durationSec)}</Mono> · <Mono className="text-ink">{notes.length}</Mono> notes</span>}
      audioSrc={`/api/v1/shared/${encodeURIComponent(token)}/audio`}
      durationSec={take.durationSec}
      notes={notes}
      report={report}
      renderComments={(seek) =>
        comments.length === 0 ? <p className="text-sm text-ink-muted">No comments on this take.</p> : <CommentList comments={comments} onSeek={seek} />
      }
    />
  );
}
