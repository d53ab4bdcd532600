// Words a tree carries that are written for its authors, put the way a technician should read them.
// A published graph never changes, so the first built-in revision still says "Default bands … —
// common practice, no source. A lead can change them": on screen that reads as typical values a
// company can change. Later revisions already say so and pass through unchanged.

const REWRITES: readonly [RegExp, string][] = [
  [/^Default bands\b/, 'Typical values'],
  [/\s*—\s*common practice, no source\.?/g, '.'],
  [/\s*\(common practice, no source\)/g, ''],
  [/\bA lead can change (them|the bands)\b/g, 'Your company can change them'],
  [/\ba lead can change the bands\b/g, 'your company can change them'],
  [/\.\./g, '.'],
  [/\.\s*;/g, ';'],
];

/** A band note as the wizard shows it. */
export function bandsNoteForScreen(note: string): string {
  let text = note;
  for (const [pattern, replacement] of REWRITES) text = text.replace(pattern, replacement);
  return text;
}
