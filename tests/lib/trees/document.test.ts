import { DEFAULT_TREE, DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import { exportTreeDocument, readTreeDocument, TREE_DOCUMENT_FORMAT, TREE_DOCUMENT_FORMAT_VERSION } from '@/lib/trees/document';

// The import/export document: what is written reads back the same; a malformed document is refused
// with every problem named by its path, and nothing partial comes out of it.

const exported = () =>
  JSON.parse(
    JSON.stringify(
      exportTreeDocument({
        tree: {
          slug: DEFAULT_TREE.slug,
          title: DEFAULT_TREE.title,
          symptom: DEFAULT_TREE.symptom,
          equipmentKind: DEFAULT_TREE.equipmentKind,
        },
        version: 3,
        graph: DEFAULT_TREE_GRAPH,
        exportedAt: new Date('2026-12-03T10:00:00Z'),
      }),
    ),
  );

function problems(doc: unknown) {
  const reading = readTreeDocument(doc);
  if (reading.ok) throw new Error('expected the document to be refused');
  return reading.problems;
}

describe('the tree document', () => {
  it('round-trips through JSON', () => {
    const doc = exported();
    expect(doc.format).toBe(TREE_DOCUMENT_FORMAT);
    expect(doc.formatVersion).toBe(TREE_DOCUMENT_FORMAT_VERSION);
    expect(doc.source).toEqual({ version: 3, exportedAt: '2026-12-03T10:00:00.000Z' });
    const reading = readTreeDocument(doc);
    expect(reading.ok).toBe(true);
    if (reading.ok) expect(reading.document.graph).toEqual(DEFAULT_TREE_GRAPH);
  });

  it.each([
    ['an array', [], ''],
    ['null', null, ''],
    ['text', 'tree', ''],
  ])('refuses %s as the whole document', (_, doc, path) => {
    expect(problems(doc)).toEqual([{ path, message: 'The document must be a JSON object' }]);
  });

  it('names the format and its version when they are not ours', () => {
    const doc = exported();
    doc.format = 'another-tool';
    doc.formatVersion = 2;
    const found = problems(doc);
    expect(found.map((p) => p.path).sort()).toEqual(['format', 'formatVersion']);
    expect(found.find((p) => p.path === 'formatVersion')?.message).toMatch(/only version this installation reads/);
  });

  it('gives the path of a schema problem deep in the graph', () => {
    const doc = exported();
    delete doc.graph.steps[2].title;
    doc.graph.steps[4].cautions = [{ signal: 'DANGER', text: '' }];
    doc.tree.slug = 'Not A Slug';
    const paths = problems(doc).map((p) => p.path);
    expect(paths).toEqual(expect.arrayContaining(['tree.slug', 'graph.steps[2].title', 'graph.steps[4].cautions[0].text']));
  });

  it('runs the validator too: an outcome to a step that is not there', () => {
    const doc = exported();
    const i = doc.graph.steps.findIndex((s: { kind: string }) => s.kind === 'action');
    doc.graph.steps[i].outcome = 'no-such-step';
    const found = problems(doc);
    expect(found.some((p) => p.path === `graph.steps[${i}]` && /no-such-step/.test(p.message))).toBe(true);
  });

  it('refuses a missing graph', () => {
    const { graph: _graph, ...doc } = exported();
    expect(problems(doc).map((p) => p.path)).toContain('graph');
  });
});
