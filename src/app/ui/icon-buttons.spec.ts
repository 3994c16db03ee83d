// Every button or link that shows only an icon must say what it does: a tooltip for the sighted
// (matTooltip) and a name for screen readers (aria-label). This reads every template in src/, so a
// new icon-only button without either fails here before it reaches a browser.

// The spec project has no Node typings; these are the few file calls this check needs.
declare function require(id: 'node:fs'): {
  readdirSync(
    dir: string,
    options: { withFileTypes: true },
  ): Array<{
    name: string;
    isDirectory(): boolean;
  }>;
  readFileSync(file: string, encoding: 'utf8'): string;
};
declare function require(id: 'node:path'): {
  join(...parts: string[]): string;
  relative(from: string, to: string): string;
  resolve(...parts: string[]): string;
};
declare const __dirname: string;

const fs = require('node:fs');
const path = require('node:path');

const APP = path.resolve(__dirname, '..');

function files(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return files(full);
    return /\.(html|ts)$/.test(entry.name) && !entry.name.endsWith('.spec.ts') ? [full] : [];
  });
}

/** The template text of a file: the whole .html, or each inline `template:` of a .ts. */
function templates(file: string): string[] {
  const text = fs.readFileSync(file, 'utf8');
  if (file.endsWith('.html')) return [text];
  return [...text.matchAll(/template:\s*`([\s\S]*?)`/g)].map((match) => match[1]);
}

const ICON_BUTTON = [
  'mat-icon-button',
  'maticonbutton',
  'mat-mini-fab',
  'matminifab',
  'mat-fab',
  'matfab',
];

function attr(element: Element, name: string): boolean {
  const lower = name.toLowerCase();
  return element
    .getAttributeNames()
    .some((a) => [lower, `[${lower}]`, `[attr.${lower}]`].includes(a.toLowerCase()));
}

/** Text a person reads on the control, leaving out icon ligatures (which are not words). */
function visibleText(element: Element): string {
  const copy = element.cloneNode(true) as Element;
  copy.querySelectorAll('mat-icon').forEach((icon) => icon.remove());
  return (copy.textContent ?? '').replace(/[@{}()]|\s+/g, ' ').trim();
}

interface Finding {
  file: string;
  control: string;
  missing: string[];
}

export function iconOnlyProblems(file: string, template: string): Finding[] {
  const doc = new DOMParser().parseFromString(`<body>${template}</body>`, 'text/html');
  const findings: Finding[] = [];
  doc.querySelectorAll('button, a').forEach((element) => {
    const names = element.getAttributeNames().map((a) => a.toLowerCase());
    const iconButton = names.some((a) => ICON_BUTTON.includes(a));
    const onlyIcon = element.querySelector('mat-icon') !== null && visibleText(element) === '';
    if (!iconButton && !onlyIcon) return;
    if (!onlyIcon) return; // an extended fab with words of its own names itself
    const missing = [
      ...(attr(element, 'aria-label') || attr(element, 'aria-labelledby') ? [] : ['aria-label']),
      ...(attr(element, 'matTooltip') ? [] : ['matTooltip']),
    ];
    if (missing.length > 0)
      findings.push({
        file: path.relative(APP, file),
        control: element.outerHTML.split('>')[0].replace(/\s+/g, ' ') + '>',
        missing,
      });
  });
  return findings;
}

describe('icon-only buttons', () => {
  it('when a template is checked, then the check itself spots a bare icon button', () => {
    // Guards the check: a bare one is found, a named one with a tooltip is not.
    expect(
      iconOnlyProblems('x.html', '<button mat-icon-button><mat-icon>tune</mat-icon></button>'),
    ).toEqual([expect.objectContaining({ missing: ['aria-label', 'matTooltip'] })]);
    expect(
      iconOnlyProblems(
        'x.html',
        `<a mat-icon-button [attr.aria-label]="'Rule of ' + sku" [matTooltip]="'Rule of ' + sku">
           <mat-icon>tune</mat-icon></a>
         <button mat-stroked-button><mat-icon>add</mat-icon> Add line</button>`,
      ),
    ).toEqual([]);
    expect(
      iconOnlyProblems(
        'x.html',
        '<button type="button" aria-label="Close"><mat-icon>close</mat-icon></button>',
      ),
    ).toEqual([expect.objectContaining({ missing: ['matTooltip'] })]);
  });

  it('when every template in src/ is read, then each icon-only button has a tooltip and an accessible name', () => {
    const all = files(APP);
    expect(all.length).toBeGreaterThan(50);
    const findings = all.flatMap((file) =>
      templates(file).flatMap((t) => iconOnlyProblems(file, t)),
    );
    expect(findings).toEqual([]);
  });
});
