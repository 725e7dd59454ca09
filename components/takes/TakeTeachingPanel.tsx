"use client";
import Link from "next/link";
import { Card } from "@/components/ui";
import { AssignmentPanel } from "@/components/assignment/AssignmentPanel";
import { ShareLinks } from "@/components/sharing/ShareLinksCard";

const linkButton =
  "inline-flex h-10 items-center rounded-md border border-rule bg-surface px-4 text-[0.9375rem] font-medium shadow-sm hover:border-ink/35";

/** Teaching on the take page: the tuning report and replay, share links (editors) and the assignment. */
export function TakeTeachingPanel({ takeId, projectId, canEdit }: { takeId: string; projectId: string; canEdit: boolean }) {
  const base = `/projects/${projectId}/takes/${takeId}`;
  return (
    <div className="space-y-6">
      <Card title="Teaching" description="The tuning report to read or print, and the replay page students see.">
        <div className="flex flex-wrap gap-2">
          <Link href={`${base}/report`} className={linkButton}>Tuning report</Link>
          <Link href={`${base}/replay`} className={linkButton}>Replay and comments</Link>
        </div>
      </Card>
      {canEdit ? (
        <Card title="Share with a student" description="A read-only link to the replay page that works without an account; it expires, and you can withdraw it.">
          <ShareLinks takeId={takeId} />
        </Card>
      ) : null}
      <Card title="Assignment" description="The notes the exercise asks for, compared with what was played.">
        <AssignmentPanel takeId={takeId} projectId={projectId} canEdit={canEdit} />
      </Card>
    </div>
  );
}
