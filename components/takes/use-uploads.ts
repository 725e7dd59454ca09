"use client";
import { useQueryClient } from "@tanstack/react-query";
import { useCallback, useEffect, useRef, useState } from "react";
import { ApiClientError } from "@/lib/client/api";
import {
  BrowserDecodeError,
  KIND_LABEL,
  KIND_MIME,
  readAudioKind,
  renderAnalysisWav,
  serverDecodes,
  type AudioKind,
} from "@/lib/client/audio-file";
import { takeKeys } from "@/lib/client/query-keys";
import { postFormWithProgress } from "@/lib/client/upload";
import { formatBytes, formatDuration } from "./format";
import type { AnalysisDto, LimitsDto, TakeDto } from "./types";

export type UploadStatus = "queued" | "preparing" | "uploading" | "processing" | "done" | "failed" | "cancelled";

export type UploadItem = {
  key: string;
  file: File;
  kind: AudioKind | null;
  status: UploadStatus;
  loadedBytes: number;
  totalBytes: number;
  /** What went wrong, or what is happening, in words a person can act on. */
  message?: string;
  take?: TakeDto;
};

/** How many files are prepared and sent at the same time. */
const PARALLEL_UPLOADS = 2;

const ACTIVE: ReadonlySet<UploadStatus> = new Set(["preparing", "uploading", "processing"]);

function takeNameOf(file: File): string {
  const base = file.name.replace(/\.[A-Za-z0-9]{1,5}$/, "").trim();
  return (base || "Untitled take").slice(0, 120);
}

function uploadErrorMessage(e: unknown): string {
  if (e instanceof ApiClientError) {
    if (e.status === 403) return "Only owners and editors can upload takes.";
    return e.message;
  }
  return e instanceof Error ? e.message : "The upload failed.";
}

/**
 * The upload queue of a project page: checks each file in the browser (size, real type
 * by its first bytes, decodability), renders a WAV where the server cannot decode the
 * original, and sends it with upload progress. Nothing is sent until `canSend` is true
 * (the consent notice is confirmed).
 */
export function useUploads(projectId: string, limits: LimitsDto | undefined, limitsSettled: boolean, canSend: boolean) {
  const queryClient = useQueryClient();
  const [items, setItems] = useState<UploadItem[]>([]);
  const itemsRef = useRef<UploadItem[]>([]);
  const aborts = useRef(new Map<string, () => void>());
  const cancelled = useRef(new Set<string>());
  const counter = useRef(0);

  const update = useCallback((key: string, patch: Partial<UploadItem>) => {
    itemsRef.current = itemsRef.current.map((it) => (it.key === key ? { ...it, ...patch } : it));
    setItems(itemsRef.current);
  }, []);

  const run = useCallback(
    async (item: UploadItem, done: () => void) => {
      const { key, file } = item;
      const fail = (message: string) => {
        if (!cancelled.current.has(key)) update(key, { status: "failed", message });
      };
      try {
        update(key, { status: "preparing", message: "Checking the file…" });
        if (limits && file.size > limits.maxBytes) {
          return fail(`This file is ${formatBytes(file.size)}; Tapernote accepts up to ${formatBytes(limits.maxBytes)} per take.`);
        }
        if (file.size === 0) return fail("This file is empty.");
        const kind = await readAudioKind(file);
        if (!kind || (limits && !limits.acceptedTypes.includes(KIND_MIME[kind]))) {
          return fail("This is not a WAV, FLAC, MP3, OGG or M4A recording (checked by its content, not its name).");
        }
        update(key, { kind });

        const form = new FormData();
        form.append("file", file, file.name);
        form.append("name", takeNameOf(file));
        if (!serverDecodes(kind)) {
          update(key, { message: `Decoding the ${KIND_LABEL[kind]} file in your browser…` });
          let rendered: Awaited<ReturnType<typeof renderAnalysisWav>>;
          try {
            rendered = await renderAnalysisWav(file);
          } catch (e) {
            return fail(e instanceof BrowserDecodeError ? e.message : "This browser could not decode this file.");
          }
          if (cancelled.current.has(key)) return;
          if (limits && rendered.durationSec > limits.maxDurationSec) {
            return fail(
              `This take is ${formatDuration(rendered.durationSec)} long; Tapernote accepts up to ${formatDuration(limits.maxDurationSec)}.`,
            );
          }
          form.append("analysis", rendered.wav, `${takeNameOf(file)}.analysis.wav`);
        }
        if (cancelled.current.has(key)) return;

        update(key, { status: "uploading", message: undefined, loadedBytes: 0 });
        const request = postFormWithProgress<{ take: TakeDto; analysis: AnalysisDto }>(
          `/api/v1/projects/${projectId}/takes`,
          form,
          (loadedBytes, totalBytes) =>
            update(key, loadedBytes >= totalBytes
              ? { loadedBytes, totalBytes, status: "processing", message: "Uploaded; the server is checking the recording…" }
              : { loadedBytes, totalBytes }),
        );
        aborts.current.set(key, request.abort);
        const result = await request.promise;
        update(key, { status: "done", message: undefined, take: result.take });
        void queryClient.invalidateQueries({ queryKey: takeKeys.list(projectId) });
      } catch (e) {
        if (cancelled.current.has(key)) return;
        fail(uploadErrorMessage(e));
      } finally {
        aborts.current.delete(key);
        done();
      }
    },
    [limits, projectId, queryClient, update],
  );

  const pump = useCallback(() => {
    if (!canSend || !limitsSettled) return;
    let active = itemsRef.current.filter((it) => ACTIVE.has(it.status)).length;
    for (const item of itemsRef.current) {
      if (active >= PARALLEL_UPLOADS) break;
      if (item.status !== "queued") continue;
      active++;
      // mark it before the async work starts, so the next pump does not pick it again
      update(item.key, { status: "preparing" });
      void run(item, () => queueMicrotask(pumpRef.current));
    }
  }, [canSend, limitsSettled, run, update]);
  const pumpRef = useRef(pump);
  useEffect(() => {
    pumpRef.current = pump;
    pump();
  }, [pump]);

  const addFiles = useCallback((files: Iterable<File>) => {
    const added: UploadItem[] = [];
    for (const file of files) {
      added.push({ key: `u${++counter.current}`, file, kind: null, status: "queued", loadedBytes: 0, totalBytes: file.size });
    }
    if (added.length === 0) return;
    itemsRef.current = [...itemsRef.current, ...added];
    setItems(itemsRef.current);
    queueMicrotask(() => pumpRef.current());
  }, []);

  const cancel = useCallback(
    (key: string) => {
      cancelled.current.add(key);
      aborts.current.get(key)?.();
      update(key, { status: "cancelled", message: "Cancelled; nothing was kept." });
      queueMicrotask(() => pumpRef.current());
    },
    [update],
  );

  const dismiss = useCallback((key: string) => {
    itemsRef.current = itemsRef.current.filter((it) => it.key !== key);
    setItems(itemsRef.current);
  }, []);

  const clearFinished = useCallback(() => {
    itemsRef.current = itemsRef.current.filter((it) => it.status !== "done" && it.status !== "cancelled" && it.status !== "failed");
    setItems(itemsRef.current);
  }, []);

  // Leaving the page stops what is still being sent.
  useEffect(() => {
    const pending = aborts.current;
    return () => pending.forEach((abort) => abort());
  }, []);

  return { items, addFiles, cancel, dismiss, clearFinished };
}
