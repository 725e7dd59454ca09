#!/bin/bash
# Retrain the engine's two learned stages (lib/engine/onset-weights.ts, lib/engine/note-weights.ts).
# Needs Debian's fluidsynth, sox, python3-mido, python3-numpy, python3-soundfile and the sound-set
# packages fluid-soundfont-gm, timgm6mb-soundfont and musescore-general-soundfont.
# Usage: npm run train [-- --count N]      (takes go to $TAPERNOTE_TRAIN_DIR, ~/.cache/tapernote-train)
set -euo pipefail
cd "$(dirname "$0")/../.."
DIR="${TAPERNOTE_TRAIN_DIR:-$HOME/.cache/tapernote-train}"
PY=/usr/bin/python3
"$PY" scripts/train/make-set.py --out "$DIR" "$@"
# the onset model's features do not depend on its weights
node --import tsx scripts/train/features.ts "$DIR" "$DIR/features.bin"
"$PY" scripts/train/train-onsets.py "$DIR/features.bin" --hidden 32 --epochs 20 --l2 1e-3
# the note check's features include the onset model's probabilities: extract them again
node --import tsx scripts/train/features.ts "$DIR" "$DIR/features.bin"
"$PY" scripts/train/train-onsets.py "$DIR/features.bin.notes" --hidden 32 --epochs 40 --l2 1e-3 --name NOTE_MODEL --out lib/engine/note-weights.ts
