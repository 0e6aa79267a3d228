// Colours come from the theme: no component or view writes a colour code of its own (hex, rgb(),
// hsl() or a named colour in a style), in its <style>, its template's inline styles or its script.
// They use the --bs-* variables App.vue sets from src/theme.ts (or the theme's chart colours).
// Also: the one .sr-only utility lives in App.vue's global style, nowhere else.
import { describe, it, expect } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';

const root = path.resolve(import.meta.dirname, '../..');

function filesUnder(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = path.join(dir, name);
    return statSync(p).isDirectory() ? filesUnder(p) : /\.(vue|ts|css)$/.test(name) ? [p] : [];
  });
}

const HEX = /#[0-9a-fA-F]{3,8}\b/;
const FUNCTION = /\b(rgba?|hsla?)\(/;
const NAMED =
  /(?:^|[\s;{])(?:color|background(?:-color)?|border(?:-\w+)*|outline(?:-color)?|fill|stroke)\s*:\s*[^;]*\b(white|black|red|green|blue|gr[ae]y|orange|yellow|purple)\b/;

/** Lines of `text` that write a colour code, as "line: text". */
export function colourCodesIn(text: string): string[] {
  return text
    .split('\n')
    .map((line, i) => [i + 1, line] as const)
    .filter(([, line]) => HEX.test(line) || FUNCTION.test(line) || NAMED.test(line))
    .map(([n, line]) => `${n}: ${line.trim()}`);
}

describe('colours come from the theme', () => {
  it('the check finds colour codes wherever they are written', () => {
    expect(colourCodesIn('.a {\n  color: #1d1f22;\n}')).toEqual(['2: color: #1d1f22;']);
    expect(colourCodesIn('<rect fill="#fff" />')).toHaveLength(1);
    expect(colourCodesIn('.a { border: 1px solid rgba(127, 127, 127, 0.5); }')).toHaveLength(1);
    expect(colourCodesIn('.a { background: white; }')).toHaveLength(1);
    expect(colourCodesIn("const c = '#b34a14';")).toHaveLength(1);
    // Not colours: a slot shorthand, a link to an anchor, a theme variable.
    expect(
      colourCodesIn('<template #default><a href="#main">Skip</a></template>\n.a { color: var(--bs-text); }'),
    ).toEqual([]);
  });

  it('no component or view writes a colour code', () => {
    const found = ['src/components', 'src/views'].flatMap((d) =>
      filesUnder(path.join(root, d)).flatMap((f) =>
        colourCodesIn(readFileSync(f, 'utf8')).map((l) => `${path.relative(root, f)}:${l}`),
      ),
    );
    expect(found, `use a --bs-* variable from src/theme.ts instead:\n${found.join('\n')}`).toEqual([]);
  });

  it('there is one .sr-only utility (App.vue), not a copy per component', () => {
    const defs = filesUnder(path.join(root, 'src'))
      .concat(path.join(root, 'src/App.vue'))
      .filter((f, i, all) => all.indexOf(f) === i)
      .filter((f) => /(^|\n)\s*\.(sr-only|visually-hidden)\s*[,{]/.test(readFileSync(f, 'utf8')))
      .map((f) => path.relative(root, f));
    expect(defs).toEqual(['src/App.vue']);
  });
});
