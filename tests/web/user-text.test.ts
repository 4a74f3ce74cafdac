import fs from 'node:fs';
import path from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const ROOT = path.resolve(import.meta.dirname, '../..');

function sourceFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) return sourceFiles(p);
    return /\.tsx?$/.test(e.name) && !e.name.endsWith('.d.ts') ? [p] : [];
  });
}

/**
 * Every piece of text in the code that can reach a user: string literals, template text and JSX
 * text — not comments, which the TypeScript scanner leaves out of these nodes.
 */
function userTexts(file: string): { text: string; line: number }[] {
  const src = ts.createSourceFile(file, fs.readFileSync(file, 'utf8'), ts.ScriptTarget.Latest, true, file.endsWith('.tsx') ? ts.ScriptKind.TSX : ts.ScriptKind.TS);
  const out: { text: string; line: number }[] = [];
  const visit = (n: ts.Node) => {
    if (ts.isStringLiteral(n) || ts.isNoSubstitutionTemplateLiteral(n) || ts.isTemplateHead(n) || ts.isTemplateMiddle(n) || ts.isTemplateTail(n) || ts.isJsxText(n)) {
      out.push({ text: n.text, line: src.getLineAndCharacterOfPosition(n.getStart()).line + 1 });
    }
    ts.forEachChild(n, visit);
  };
  visit(src);
  return out;
}

describe('words that reach the user', () => {
  it('when the client and the server are searched, then no text a user can see says "from memory" (it says "typical textbook values"), while code comments may', () => {
    const files = [...sourceFiles(path.join(ROOT, 'web/src')), ...sourceFiles(path.join(ROOT, 'server')), ...sourceFiles(path.join(ROOT, 'jobs'))];
    expect(files.length).toBeGreaterThan(50);
    const hits = files.flatMap((f) =>
      userTexts(f)
        .filter((t) => /from\s+memory/i.test(t.text))
        .map((t) => `${path.relative(ROOT, f)}:${t.line}: ${t.text.trim().slice(0, 120)}`),
    );
    expect(hits).toEqual([]);
    // the scan does see text: the seat defaults say where their figures come from in the words we use
    const seat = userTexts(path.join(ROOT, 'server/physics/seat.ts')).map((t) => t.text);
    expect(seat.some((t) => t.includes('typical textbook values'))).toBe(true);
  });
});
