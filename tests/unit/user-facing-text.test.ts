import fs from 'node:fs';
import path from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

/**
 * What a user, a script or a referee reads — string literals, template text and JSX text in the
 * app, the components and the library (the exported methods text is built from those) — never
 * points at a document outside the repository or says a number was recalled rather than looked
 * up. Comments are not read: they are for the code's readers.
 */
const ROOT = path.resolve(__dirname, '../..');
const FOLDERS = ['app', 'components', 'lib'];
const FORBIDDEN = [/SCIENCE/, /from memory/i];

function sourceFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const full = path.join(dir, e.name);
    if (e.isDirectory()) return sourceFiles(full);
    return /\.(ts|tsx)$/.test(e.name) && !e.name.endsWith('.d.ts') ? [full] : [];
  });
}

/** Every piece of literal text in a file, with its line number. */
function literalTexts(file: string): Array<{ line: number; text: string }> {
  const code = fs.readFileSync(file, 'utf8');
  const kind = file.endsWith('.tsx') ? ts.ScriptKind.TSX : ts.ScriptKind.TS;
  const sf = ts.createSourceFile(file, code, ts.ScriptTarget.Latest, true, kind);
  const found: Array<{ line: number; text: string }> = [];
  const visit = (node: ts.Node) => {
    if (
      ts.isStringLiteral(node) ||
      ts.isNoSubstitutionTemplateLiteral(node) ||
      ts.isTemplateHead(node) ||
      ts.isTemplateMiddle(node) ||
      ts.isTemplateTail(node) ||
      ts.isJsxText(node)
    ) {
      found.push({
        line: sf.getLineAndCharacterOfPosition(node.getStart()).line + 1,
        text: node.text,
      });
    }
    ts.forEachChild(node, visit);
  };
  visit(sf);
  return found;
}

function hits(files: string[]): string[] {
  return files.flatMap((file) =>
    literalTexts(file)
      .filter(({ text }) => FORBIDDEN.some((re) => re.test(text)))
      .map(({ line, text }) => `${path.relative(ROOT, file)}:${line}: ${text.slice(0, 80)}`),
  );
}

describe('user-facing text', () => {
  const files = FOLDERS.flatMap((f) => sourceFiles(path.join(ROOT, f)));

  it('reads the literal text of the app, the components and the library', () => {
    expect(files.length).toBeGreaterThan(50);
    // the reader finds a known literal (the calculators page title), so an empty scan cannot pass
    const page = files.find((f) => f.endsWith(path.join('tools', 'page.tsx')));
    expect(page && literalTexts(page).some(({ text }) => text === 'Calculators')).toBe(true);
  });

  it('finds the words it looks for where they are', () => {
    const probe = path.join(ROOT, 'tests', 'unit', '.user-facing-probe.tsx');
    fs.writeFileSync(
      probe,
      '// SCIENCE in a comment is not user-facing\nexport const a = `see ${1} SCIENCE.md`;\nexport const B = () => <p>values from memory</p>;\n',
    );
    try {
      expect(hits([probe]).map((h) => h.split(':')[1])).toEqual(['2', '3']);
    } finally {
      fs.unlinkSync(probe);
    }
  });

  it('never cites SCIENCE or says "from memory"', () => {
    expect(hits(files)).toEqual([]);
  });
});
