"use client";
import { Mono } from "@/components/ui";

/** The master level of a player (0–1, shown in %), for the take page's transport and the replay page. */
export function LevelControl({ level, onChange }: { level: number; onChange: (level: number) => void }) {
  const percent = Math.round(level * 100);
  return (
    <label className="ml-auto flex items-center gap-2 text-sm">
      Level
      <input
        type="range"
        min={0}
        max={1}
        step={0.05}
        value={level}
        onChange={(e) => onChange(Number(e.target.value))}
        className="w-24 accent-[var(--tn-copper)]"
        aria-label="Level"
        aria-valuetext={`${percent} %`}
        data-testid="level"
      />
      <Mono className="w-10 text-right">{percent} %</Mono>
    </label>
  );
}
