"use client";
import { HydrationBoundary, QueryClient, dehydrate } from "@tanstack/react-query";
import { useMemo, type ReactNode } from "react";
import { takeKeys } from "@/lib/client/query-keys";
import { reportKeys } from "@/components/report/keys";
import type { CurveNotesDto } from "@/components/report/types";
import { fromNoteRows, type WithNoteRows } from "@/lib/music/note-rows";
import type { TakeNotesDto } from "./types";

/**
 * What the take page's server part read for the browser: the take (`GET /api/v1/takes/{id}`'s
 * answer) and its notes with pitch curves (`…/notes?curves=1`'s, its notes as rows, see
 * lib/music/note-rows; null while there are none), as JSON texts, and when they were read (ms
 * since the epoch).
 */
export type TakePageInitial = { at: number; take: string; curves: string | null };

/**
 * Puts the server's answers in the query cache under the keys the take page's hooks ask for
 * (the take, its notes with and without pitch curves), so the first render already has them.
 * A cache that holds newer answers (a client-side return to the page) keeps its own.
 */
export function TakePageData({ takeId, initial, children }: { takeId: string; initial: TakePageInitial | null; children: ReactNode }) {
  const state = useMemo(() => {
    if (!initial) return null;
    const client = new QueryClient();
    const at = { updatedAt: initial.at };
    client.setQueryData(takeKeys.detail(takeId), JSON.parse(initial.take), at);
    const curves = initial.curves === null ? null : fromNoteRows<CurveNotesDto>(JSON.parse(initial.curves) as WithNoteRows<CurveNotesDto>);
    client.setQueryData(reportKeys.curves(takeId), curves, at);
    // the same notes as `…/notes` answers them: without the curves
    const plain: TakeNotesDto | null = curves && { ...curves, notes: curves.notes.map(({ pitchCurve: _c, ...n }) => n) };
    client.setQueryData(takeKeys.notes(takeId), plain, at);
    return dehydrate(client);
  }, [takeId, initial]);
  return <HydrationBoundary state={state}>{children}</HydrationBoundary>;
}
