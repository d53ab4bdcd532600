import { NO_HEAT_DSI_R1 } from '@/lib/trees/builtin/no-heat-dsi-r1';
import { DEFAULT_TREE } from '@/lib/trees/default-tree';
import { bandsNoteForScreen } from '@/lib/trees/wording';

function notesOf(graph: { steps: readonly object[] }): string[] {
  return graph.steps.flatMap((s) => ('bandsNote' in s && typeof s.bandsNote === 'string' ? [s.bandsNote] : []));
}

describe('band notes on screen', () => {
  it("puts every note of the first built-in revision in plain words, none left as an editor's note", () => {
    const notes = notesOf(NO_HEAT_DSI_R1.graph);
    expect(notes.length).toBeGreaterThan(5);
    for (const note of notes) {
      const shown = bandsNoteForScreen(note);
      expect(shown).not.toMatch(/common practice|no source|Default bands|A lead can/i);
      expect(shown).toMatch(/Typical values|your company can change them/i);
      expect(shown).not.toMatch(/\.\.|\.;|\s—\s*\./);
    }
  });

  it("rewrites the first revision's line-voltage note to the wording of the current one", () => {
    expect(
      bandsNoteForScreen(
        "Default bands for a 24 VAC control circuit — common practice, no source. A lead can change them; the rating plate and the manufacturer's data rule.",
      ),
    ).toBe("Typical values for a 24 VAC control circuit. Your company can change them; the rating plate and the manufacturer's data rule.");
  });

  it("leaves the current revision's notes as they are", () => {
    for (const note of notesOf(DEFAULT_TREE.graph)) expect(bandsNoteForScreen(note)).toBe(note);
  });
});
