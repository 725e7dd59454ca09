"use client";
import Link from "next/link";
import { useMemo, useState } from "react";
import {
  Alert,
  Button,
  DeleteForGoodDialog,
  DataTable,
  Dialog,
  EmptyState,
  Mono,
  PageHeader,
  createDataTableColumns,
  PendingLinkHint,
} from "@/components/ui";
import { ProjectForm } from "./ProjectForm";
import { useCreateProject } from "./use-create-project";
import { useDeleteProject } from "./use-delete-project";
import { useProjects } from "./use-projects";
import { useUpdateProject } from "./use-update-project";
import type { ProjectDto } from "@/lib/schemas/project";

const col = createDataTableColumns<ProjectDto>();
const dateFormat = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "short" });

export function ProjectsView({ studioName, canEdit }: { studioName: string; canEdit: boolean }) {
  const projects = useProjects();
  const create = useCreateProject();
  const update = useUpdateProject();
  const remove = useDeleteProject();
  const [creating, setCreating] = useState(false);
  const [renaming, setRenaming] = useState<ProjectDto | null>(null);
  const [deleting, setDeleting] = useState<ProjectDto | null>(null);

  const columns = useMemo(
    () =>
      col.columns([
        col.accessor("name", {
          header: "Project",
          cell: (c) => (
            <Link href={`/projects/${c.row.original.id}`} className="font-medium underline-offset-2 hover:underline">
              {c.getValue()}
              <PendingLinkHint />
            </Link>
          ),
        }),
        col.accessor("description", { header: "Description", enableSorting: false, cell: (c) => <span className="text-ink-muted">{c.getValue()}</span> }),
        col.accessor((p) => new Date(p.updatedAt), {
          id: "updatedAt",
          header: "Last changed",
          sortFn: "datetime",
          cell: (c) => <Mono>{dateFormat.format(c.getValue())}</Mono>,
        }),
        col.display({
          id: "actions",
          header: () => <span className="sr-only">Actions</span>,
          cell: ({ row }) =>
            canEdit ? (
              <div className="flex justify-end gap-1">
                <Button size="sm" variant="ghost" onClick={() => setRenaming(row.original)} aria-label={`Rename ${row.original.name}`}>
                  Rename
                </Button>
                <Button size="sm" variant="ghost" onClick={() => setDeleting(row.original)} aria-label={`Delete ${row.original.name}`}>
                  Delete
                </Button>
              </div>
            ) : null,
        }),
      ]),
    [canEdit],
  );

  return (
    <div className="space-y-6">
      <PageHeader
        title="Projects"
        description={`Folders of takes in ${studioName}.`}
        actions={canEdit ? <Button onClick={() => setCreating(true)}>New project</Button> : null}
      />
      {projects.isError ? (
        <Alert tone="error" title="The projects could not be loaded" action={<Button size="sm" variant="secondary" onClick={() => projects.refetch()}>Try again</Button>}>
          {projects.error.message}
        </Alert>
      ) : (
        <DataTable
          columns={columns}
          data={projects.data ?? []}
          isLoading={projects.isPending}
          getRowId={(p) => p.id}
          initialSorting={[{ id: "updatedAt", desc: true }]}
          emptyState={
            <EmptyState
              title="No projects yet"
              description={canEdit ? "Create a project to hold the takes of a class, an ensemble or a piece." : "The studio's editors have not created a project yet."}
              action={canEdit ? <Button onClick={() => setCreating(true)}>New project</Button> : undefined}
            />
          }
        />
      )}

      <Dialog open={creating} onClose={() => setCreating(false)} title="New project">
        {creating ? (
          <ProjectForm
            submitLabel="Create project"
            onCancel={() => setCreating(false)}
            onSubmit={async (input) => {
              await create.mutateAsync(input);
              setCreating(false);
            }}
          />
        ) : null}
      </Dialog>

      <Dialog open={!!renaming} onClose={() => setRenaming(null)} title="Rename project">
        {renaming ? (
          <ProjectForm
            initial={renaming}
            submitLabel="Save"
            onCancel={() => setRenaming(null)}
            onSubmit={async (input) => {
              await update.mutateAsync({ id: renaming.id, ...input });
              setRenaming(null);
            }}
          />
        ) : null}
      </Dialog>

      <DeleteForGoodDialog
        item={deleting}
        title="Delete this project?"
        message={(p) => <><strong>{p.name}</strong> and everything in it will be deleted for good. This cannot be undone.</>}
        onCancel={() => setDeleting(null)}
        onDelete={(p) => remove.mutateAsync(p.id)}
        onDeleted={() => setDeleting(null)}
      />
    </div>
  );
}
