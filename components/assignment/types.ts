import type { ExpectedNoteResult, PlayedNoteResult } from "@/lib/music/align";

export type AssignmentInfoDto = { id: string; name: string; sourceFormat: "midi" | "musicxml" | "take"; noteCount: number; createdAt: string };

/** `GET /api/v1/takes/{takeId}/assignment`. */
export type AssignmentDto = {
  assignment: AssignmentInfoDto;
  result: {
    counts: { expected: number; played: number; matched: number; missed: number; extra: number; offPitch: number };
    score: number | null;
    precision: number | null;
    recall: number | null;
    fMeasure: number | null;
    tempoRatio: number | null;
    offsetSec: number | null;
    expected: ExpectedNoteResult[];
    played: PlayedNoteResult[];
  };
};

export type AssignmentSource = { file: File } | { fromTakeId: string; revision?: number };
