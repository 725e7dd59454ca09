import type { Metadata } from "next";
import Link from "next/link";
import { Cents, Mono } from "@/components/ui";

export const metadata: Metadata = {
  title: "Tapernote — turn a recording into the notes that were played",
  description:
    "Tapernote takes a recording, finds the notes sounding together and gives each one its onset, length, loudness and tuning in cents. Play it back, correct it in a piano roll, share it with students, export Standard MIDI.",
};

/* ---------- the decorative score ---------- */

type Voice = "teal" | "plum" | "ochre" | "slate" | "rose" | "olive";

const voiceFill: Record<Voice, string> = {
  teal: "fill-voice-teal",
  plum: "fill-voice-plum",
  ochre: "fill-voice-ochre",
  slate: "fill-voice-slate",
  rose: "fill-voice-rose",
  olive: "fill-voice-olive",
};

/** [x, row, length, voice]; a row is one semitone, 8 px high, counted down from the top. */
const NOTES: Array<[number, number, number, Voice]> = [
  // chord 1
  [44, 16, 112, "teal"],
  [44, 12, 112, "plum"],
  [44, 9, 112, "ochre"],
  [44, 4, 104, "slate"],
  // chord 2
  [164, 14, 96, "teal"],
  [164, 10, 96, "plum"],
  [164, 7, 96, "ochre"],
  [164, 2, 44, "rose"],
  [212, 3, 46, "rose"],
  // chord 3
  [268, 17, 150, "teal"],
  [268, 13, 150, "plum"],
  [268, 10, 72, "ochre"],
  [344, 9, 74, "ochre"],
  [268, 5, 36, "olive"],
  [308, 3, 34, "olive"],
  [346, 1, 70, "olive"],
  // chord 4
  [428, 16, 168, "teal"],
  [428, 11, 168, "plum"],
  [428, 8, 168, "ochre"],
  [428, 4, 90, "slate"],
  [522, 2, 74, "rose"],
];

const ROLL_TOP = 92;
const ROW = 8;

function rowY(row: number) {
  return ROLL_TOP + row * ROW;
}

/** A Hann-like bell drawn with two cubic curves, from x0 over width w. */
function taperPath(x0: number, w: number, baseY: number, peakY: number) {
  return `M${x0} ${baseY}C${x0 + w * 0.28} ${baseY} ${x0 + w * 0.3} ${peakY} ${x0 + w / 2} ${peakY}S${x0 + w * 0.72} ${baseY} ${x0 + w} ${baseY}`;
}

function ScoreDrawing() {
  const rows = Array.from({ length: 20 }, (_, i) => i);
  return (
    <svg
      aria-hidden="true"
      focusable="false"
      viewBox="0 0 640 270"
      className="h-auto w-full"
      fill="none"
    >
      {/* tapered frames over a hairline: overlapping windows, one in copper */}
      <line x1="24" x2="616" y1="66" y2="66" className="stroke-rule" strokeWidth="1" />
      {[24, 104, 184, 264, 344, 424].map((x) => (
        <path
          key={x}
          d={taperPath(x, 176, 66, 20)}
          className={x === 264 ? "stroke-copper" : "stroke-ink-muted/35"}
          strokeWidth={x === 264 ? 2 : 1.25}
        />
      ))}

      {/* the ruled grid: one line per semitone, two five-line staves marked a little stronger */}
      {rows.map((i) => {
        const staff = i % 2 === 1; // rows 1–9 and 11–19: two five-line staves
        return (
          <line
            key={i}
            x1="24"
            x2="616"
            y1={rowY(i) + ROW / 2}
            y2={rowY(i) + ROW / 2}
            className={staff ? "stroke-ink-muted/30" : "stroke-rule/70"}
            strokeWidth={staff ? 1 : 0.75}
          />
        );
      })}
      {[24, 164, 268, 428, 616].map((x) => (
        <line
          key={x}
          x1={x}
          x2={x}
          y1={ROLL_TOP}
          y2={rowY(19) + ROW}
          className="stroke-rule"
          strokeWidth="1"
          strokeDasharray={x === 24 || x === 616 ? undefined : "2 4"}
        />
      ))}

      {/* notes: flat rounded rectangles, one colour per voice */}
      {NOTES.map(([x, row, length, voice]) => (
        <rect
          key={`${x}-${row}`}
          x={x}
          y={rowY(row) + 0.5}
          width={length}
          height={ROW - 1}
          rx="3"
          className={voiceFill[voice]}
        />
      ))}
      {/* a pitch curve traced inside two notes */}
      <path
        d={`M272 ${rowY(13) + 5}c14 -1.6 22 1.4 36 0.4s24 -1.8 38 -0.2 26 1.2 40 0 18 -1 24 0`}
        className="stroke-paper/80"
        strokeWidth="1.2"
        strokeLinecap="round"
      />
      <path
        d={`M432 ${rowY(8) + 5}c20 0.8 30 -1.4 50 -0.6s34 1.6 52 0.4 22 -1 26 -0.2`}
        className="stroke-paper/80"
        strokeWidth="1.2"
        strokeLinecap="round"
      />

      {/* tuning tags beside two notes */}
      <g className="font-mono" fontSize="13" fontWeight="500">
        <text x={272} y={rowY(10) - 3} className="fill-[var(--tn-sharp-text)]">
          +18.4 ¢
        </text>
        <text x={522} y={rowY(1) + 1} className="fill-[var(--tn-flat-text)]">
          −12.0 ¢
        </text>
      </g>

      {/* the playhead */}
      <line x1="386" x2="386" y1="74" y2={rowY(19) + ROW + 6} className="stroke-copper" strokeWidth="1.75" />
      <path d="M380 72h12l-6 7z" className="fill-copper" />
    </svg>
  );
}

/* ---------- page ---------- */

const STEPS = [
  {
    term: "A take",
    text: "Upload a recording — WAV, FLAC, MP3, OGG or M4A, even a phone recording of a lesson.",
  },
  {
    term: "Tapered frames",
    text: "Tapernote cuts the take into short overlapping frames, each shaped by a taper such as Hann or Blackman–Harris. Low registers get long frames so neighbouring semitones separate; fast passages get short ones.",
  },
  {
    term: "The notes sounding together",
    text: "The spectral peaks of each frame are resolved into the several notes sounding at once — a chord, a bass line under a melody — with octaves and doubled fifths kept apart.",
  },
  {
    term: "Notes",
    text: "Frames are joined into notes, each with its onset, length, loudness and tuning in cents, against equal temperament or just intervals above the chord's root.",
  },
];

const THEN = [
  { term: "Play back", text: "Hear the original, the notes, or both together, in sync and in a loop." },
  { term: "Correct", text: "Fix the draft in a piano roll: select, draw, erase, split, join. Every save is a numbered revision." },
  { term: "Share", text: "Send a student a link to a read-only replay with your comments and a tuning report." },
  { term: "Export", text: "Download a Standard MIDI File (pitch bend for the cents if you want it), MusicXML or CSV." },
];

const PEOPLE = [
  {
    who: "Teachers",
    text: "See which notes a student's chord exercise really had and how many cents sharp or flat each one was, check it against the assignment, and send the student a link.",
  },
  {
    who: "Arrangers",
    text: "Get an editable draft of the notes in a take, re-voice it in the piano roll, and take it into your arranging software as MIDI or MusicXML.",
  },
  {
    who: "Studios",
    text: "Run many takes, export often, and manage members as owners, editors and listeners. A free monthly export allowance, and export packs when you need more.",
  },
];

const SAMPLE: Array<{ note: string; onset: string; length: string; velocity: number; cents: number }> = [
  { note: "C3", onset: "0.000", length: "1.240", velocity: 74, cents: -2.4 },
  { note: "E3", onset: "0.012", length: "1.228", velocity: 61, cents: -14.2 },
  { note: "G3", onset: "0.008", length: "1.196", velocity: 66, cents: 3.1 },
  { note: "C4", onset: "0.021", length: "1.180", velocity: 58, cents: 18.4 },
];

export default function LandingPage() {
  return (
    <>
      {/* hero */}
      <section className="mx-auto grid w-full max-w-6xl items-center gap-10 px-5 pt-14 pb-16 sm:px-8 lg:grid-cols-[1.05fr_1fr] lg:pt-20">
        <div>
          <p className="text-sm font-medium tracking-wide text-copper uppercase">From a recording to its notes</p>
          <h1 className="mt-3 text-4xl font-semibold text-ink sm:text-5xl">
            Hear a take. Read its&nbsp;notes.
          </h1>
          <p className="mt-5 max-w-xl text-lg text-ink-muted">
            Tapernote listens to a recording, finds the notes sounding together and writes each one down with its
            onset, length, loudness and tuning in cents. Play it back, correct it in a piano roll, share it with your
            students and export it as a Standard MIDI File.
          </p>
          <div className="mt-8 flex flex-wrap items-center gap-3">
            <Link
              href="/sign-up"
              className="inline-flex h-11 items-center rounded-md bg-copper px-5 font-medium text-on-copper no-underline shadow-sm hover:brightness-95"
            >
              Create an account
            </Link>
            <Link
              href="/sign-in"
              className="inline-flex h-11 items-center rounded-md border border-rule bg-surface px-5 font-medium text-ink no-underline shadow-sm hover:border-ink/35"
            >
              Sign in
            </Link>
          </div>
          <p className="mt-4 text-sm text-ink-muted">For music teachers, arrangers and small studios.</p>
        </div>

        <figure className="rounded-xl border border-rule bg-surface p-4 shadow-card sm:p-5">
          <ScoreDrawing />
          <figcaption className="mt-2 flex flex-wrap items-center justify-between gap-2 border-t border-rule pt-3 text-xs text-ink-muted">
            <span>Tapered frames above, the notes they found below, one colour per voice.</span>
            <span className="inline-flex items-center gap-1.5">
              <span aria-hidden="true" className="inline-block h-3 w-0.5 bg-copper" />
              playhead
            </span>
          </figcaption>
        </figure>
      </section>

      {/* how it works */}
      <section aria-labelledby="how" className="border-y border-rule/80 bg-surface/70">
        <div className="mx-auto w-full max-w-6xl px-5 py-14 sm:px-8">
          <h2 id="how" className="text-2xl font-semibold text-ink">
            How a take becomes notes
          </h2>
          <ol className="mt-8 grid gap-6 sm:grid-cols-2 lg:grid-cols-4">
            {STEPS.map((step, i) => (
              <li key={step.term} className="relative border-t-2 border-ink/80 pt-4">
                <span className="font-mono text-xs text-ink-muted">{String(i + 1).padStart(2, "0")}</span>
                <h3 className="mt-1 text-base font-semibold text-ink">{step.term}</h3>
                <p className="mt-2 text-[0.9375rem] text-ink-muted">{step.text}</p>
              </li>
            ))}
          </ol>

          <div className="mt-12 grid items-start gap-10 lg:grid-cols-[1fr_1.1fr]">
            <div>
              <h3 className="text-lg font-semibold text-ink">What a draft looks like</h3>
              <p className="mt-2 max-w-md text-[0.9375rem] text-ink-muted">
                A C major chord from a phone recording. In tune is plain ink; flat leans to blue, sharp to orange — and
                the number of cents is always written beside it.
              </p>
            </div>
            <div className="overflow-x-auto rounded-lg border border-rule bg-surface">
              <table className="w-full text-left text-sm">
                <caption className="sr-only">Four notes of a sample draft</caption>
                <thead className="border-b border-rule bg-paper/70 text-[0.8125rem] text-ink-muted">
                  <tr>
                    <th scope="col" className="px-3 py-2.5 font-semibold">Note</th>
                    <th scope="col" className="px-3 py-2.5 text-right font-semibold">Onset (s)</th>
                    <th scope="col" className="px-3 py-2.5 text-right font-semibold">Length (s)</th>
                    <th scope="col" className="hidden px-3 py-2.5 text-right font-semibold sm:table-cell">Velocity</th>
                    <th scope="col" className="px-3 py-2.5 text-right font-semibold">Tuning</th>
                  </tr>
                </thead>
                <tbody>
                  {SAMPLE.map((n) => (
                    <tr key={n.note} className="border-b border-rule/70 last:border-b-0">
                      <td className="px-3 py-2.5 font-medium text-ink">{n.note}</td>
                      <td className="px-3 py-2.5 text-right"><Mono>{n.onset}</Mono></td>
                      <td className="px-3 py-2.5 text-right"><Mono>{n.length}</Mono></td>
                      <td className="hidden px-3 py-2.5 text-right sm:table-cell"><Mono>{n.velocity}</Mono></td>
                      <td className="px-3 py-2.5 text-right"><Cents value={n.cents} gauge /></td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          </div>
        </div>
      </section>

      {/* then */}
      <section aria-labelledby="then" className="mx-auto w-full max-w-6xl px-5 py-14 sm:px-8">
        <h2 id="then" className="text-2xl font-semibold text-ink">
          Then
        </h2>
        <dl className="mt-6 grid gap-x-8 gap-y-6 sm:grid-cols-2 lg:grid-cols-4">
          {THEN.map((item) => (
            <div key={item.term}>
              <dt className="text-base font-semibold text-ink">{item.term}</dt>
              <dd className="mt-1.5 text-[0.9375rem] text-ink-muted">{item.text}</dd>
            </div>
          ))}
        </dl>
      </section>

      {/* for whom */}
      <section aria-labelledby="who" className="mx-auto w-full max-w-6xl px-5 pb-16 sm:px-8">
        <h2 id="who" className="text-2xl font-semibold text-ink">
          Who it is for
        </h2>
        <div className="mt-6 grid gap-5 md:grid-cols-3">
          {PEOPLE.map((p) => (
            <div key={p.who} className="rounded-lg border border-rule bg-surface p-5 shadow-card">
              <h3 className="text-base font-semibold text-ink">{p.who}</h3>
              <p className="mt-2 text-[0.9375rem] text-ink-muted">{p.text}</p>
            </div>
          ))}
        </div>
        <p className="mt-6 max-w-3xl text-sm text-ink-muted">
          Student recordings are personal: only members of your studio can open them, by role, and a take can be
          deleted for good.
        </p>
      </section>

      {/* closing call */}
      <section className="border-t border-rule/80">
        <div className="mx-auto flex w-full max-w-6xl flex-wrap items-center justify-between gap-6 px-5 py-12 sm:px-8">
          <div>
            <h2 className="text-xl font-semibold text-ink">Bring your first take.</h2>
            <p className="mt-1 text-[0.9375rem] text-ink-muted">Create a studio, upload a recording, read its notes.</p>
          </div>
          <div className="flex flex-wrap gap-3">
            <Link
              href="/sign-up"
              className="inline-flex h-11 items-center rounded-md bg-copper px-5 font-medium text-on-copper no-underline shadow-sm hover:brightness-95"
            >
              Create an account
            </Link>
            <Link
              href="/sign-in"
              className="inline-flex h-11 items-center rounded-md px-4 font-medium text-ink no-underline hover:bg-ink/[0.06]"
            >
              Sign in
            </Link>
          </div>
        </div>
      </section>
    </>
  );
}
