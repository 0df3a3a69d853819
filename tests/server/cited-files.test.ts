/**
 * Every repository file that the code, the tests and the docs cite exists: a path from the
 * repository root (`docs/engine.md`, `tests/fixtures/scipy/make-fixtures.py`,
 * `shared/engine/version.ts`) anywhere in a tracked text file, and a relative Markdown link
 * (`[x](engine-spectra.md)`) from the folder of the document. A citation of a file that was
 * moved, renamed or never added fails here with the file and line that cite it.
 */
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

const root = path.resolve(__dirname, '../..');
const TOP = ['app', 'assets', 'docs', 'migrations', 'scenarios', 'server', 'shared', 'tests', 'types'];
// A root-relative path: starts at a top-level folder (not inside another path or word), made of
// path characters, ending in a file extension. Globs and placeholders (`*`, `{a,b}`, `<name>`)
// stop the match, so they are not taken for files.
const ROOT_PATH = new RegExp(`(?<![\\w./@-])(?:${TOP.join('|')})/[\\w./-]*\\.(?:md|ts|tsx|js|mjs|py|json|csv|sql)\\b`, 'g');
const MD_LINK = /\]\(((?!https?:|mailto:|#)[^)\s#]+)(?:#[^)]*)?\)/g;
// Lints snippets at made-up paths on purpose: those paths are not citations.
const NOT_CITING = new Set(['tests/server/lint-boundaries.test.ts']);

function trackedTextFiles(): string[] {
  const out = execFileSync('git', ['ls-files', '-z'], { cwd: root, encoding: 'utf8' });
  return out
    .split('\0')
    .filter((f) => /\.(ts|tsx|js|mjs|md|py)$/.test(f) && !f.startsWith('tests/fixtures/') && !NOT_CITING.has(f))
    .filter((f) => fs.existsSync(path.join(root, f)));
}

function citations(): { from: string; line: number; cited: string; resolved: string }[] {
  const found: { from: string; line: number; cited: string; resolved: string }[] = [];
  for (const file of trackedTextFiles()) {
    const lines = fs.readFileSync(path.join(root, file), 'utf8').split('\n');
    lines.forEach((text, i) => {
      for (const m of text.matchAll(ROOT_PATH)) found.push({ from: file, line: i + 1, cited: m[0], resolved: m[0] });
      if (file.endsWith('.md')) {
        for (const m of text.matchAll(MD_LINK)) {
          found.push({ from: file, line: i + 1, cited: m[1], resolved: path.posix.normalize(path.posix.join(path.posix.dirname(file), m[1])) });
        }
      }
    });
  }
  return found;
}

describe('cited repository files exist', () => {
  const all = citations();

  it('finds the citations it is meant to check', () => {
    // Known citations (from this test's own reading of the tree): the engine's types cite
    // docs/engine.md, and DEVELOPERS.md cites the fixture script.
    expect(all).toEqual(expect.arrayContaining([expect.objectContaining({ from: 'shared/engine/types.ts', resolved: 'docs/engine.md' })]));
    expect(all.some((c) => c.from === 'DEVELOPERS.md' && c.resolved === 'tests/fixtures/scipy/make-fixtures.py')).toBe(true);
  });

  it('every cited file is in the repository', () => {
    const missing = all.filter((c) => !fs.existsSync(path.join(root, c.resolved))).map((c) => `${c.from}:${c.line} cites ${c.cited}`);
    expect(missing).toEqual([]);
  });
});
