// Every citation of the check values' sources points inside the repository: each
// "SOURCES.md §N" or "§N.M" names a section that tests/reference/SOURCES.md has, and no file cites
// the reference notes kept outside the repository, which a reader of the code cannot open.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';

const ROOT = path.resolve(__dirname, '../../..');
const SOURCES = path.join(ROOT, 'tests/reference/SOURCES.md');
const SEARCHED = ['app', 'components', 'constants', 'db', 'examples', 'hooks', 'scripts', 'server', 'tests', 'DEVELOPERS.md', 'README.md'];
const SKIPPED_DIRS = new Set(['node_modules', '.git', 'dist', '.data', '.artifacts', '.expo']);

function filesUnder(rel: string): string[] {
  const abs = path.join(ROOT, rel);
  let stat;
  try {
    stat = statSync(abs);
  } catch {
    return [];
  }
  if (stat.isFile()) return /\.(ts|tsx|js|md|sh|json)$/.test(rel) ? [rel] : [];
  return readdirSync(abs).flatMap((name) => (SKIPPED_DIRS.has(name) ? [] : filesUnder(path.join(rel, name))));
}

const files = SEARCHED.flatMap(filesUnder).filter((f) => path.resolve(ROOT, f) !== SOURCES);
const text = new Map(files.map((f) => [f, readFileSync(path.join(ROOT, f), 'utf8')]));

/** Sections of SOURCES.md by their anchors: <a id="s6-2"></a> is §6.2. */
function sectionsOfSources(): Set<string> {
  const md = readFileSync(SOURCES, 'utf8');
  return new Set([...md.matchAll(/<a id="s(\d+)(?:-(\d+))?"><\/a>/g)].map((m) => (m[2] ? `${m[1]}.${m[2]}` : m[1])));
}

/** "SOURCES.md §1 and §2", "SOURCES.md §7.4", "SOURCES.md §3 "fba"" → the sections named. */
function citedSections(source: string): string[] {
  const found: string[] = [];
  for (const m of source.matchAll(/SOURCES\.md((?:[\s,]*(?:and\s+)?§\d+(?:\.\d+)?)+)/g)) {
    for (const s of m[1].matchAll(/§(\d+(?:\.\d+)?)/g)) found.push(s[1]);
  }
  return found;
}

// Files allowed, for a while, to cite the notes outside the repository (none now).
const PENDING: string[] = [];

describe('tests/reference/SOURCES.md', () => {
  const sections = sectionsOfSources();

  it('has an anchor for every numbered heading, and sections §1 to §7', () => {
    const md = readFileSync(SOURCES, 'utf8');
    const headings = [...md.matchAll(/^#{2,3} §(\d+(?:\.\d+)?) /gm)].map((m) => m[1]);
    expect(headings.length).toBeGreaterThan(10);
    for (const h of headings) expect(sections).toContain(h);
    for (const n of ['1', '2', '3', '4', '5', '6', '7']) expect(sections).toContain(n);
  });

  it('every citation in the code and tests names a section it has', () => {
    const cited = [...text].flatMap(([file, source]) => citedSections(source).map((s) => ({ file, s })));
    // the cautions, units, chart checks and size advice all cite it
    expect(cited.length).toBeGreaterThan(30);
    expect(cited.filter((c) => !sections.has(c.s))).toEqual([]);
  });

  it('no file cites the reference notes kept outside the repository (except those still being rewritten)', () => {
    // Built from parts so this file does not match itself.
    const notes = new RegExp(`${['shared', 'reference'].join('/')}|${['trade', 'facts'].join('-')}`);
    const outside = [...text].filter(([, source]) => notes.test(source)).map(([file]) => file);
    expect(outside.filter((f) => !PENDING.includes(f))).toEqual([]);
    // A pending file that no longer cites them is done: take it off the list.
    expect(PENDING.filter((f) => !outside.includes(f))).toEqual([]);
  });
});
