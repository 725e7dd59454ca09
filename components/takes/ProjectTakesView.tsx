"use client";
import { TakesTable } from "./TakesTable";
import { UploadArea } from "./UploadArea";

/** The project page's body: uploads for owners and editors, then the takes. */
export function ProjectTakesView({ projectId, canEdit }: { projectId: string; canEdit: boolean }) {
  return (
    <div className="space-y-8">
      {canEdit ? <UploadArea projectId={projectId} /> : null}
      <TakesTable projectId={projectId} canEdit={canEdit} />
    </div>
  );
}
