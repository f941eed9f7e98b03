/**
 * A figure as it leaves Sigmaline: a title, one or more panels (each a plot drawn as SVG by the
 * plotting library, with its caption), and a provenance line (cruise, line, software version,
 * date). Pure string work, so it runs in the browser and in tests alike.
 */

export interface FigurePanel {
  /** The plot as a standalone SVG document (what the library's toImage gives for 'svg'). */
  svg: string;
  width: number;
  height: number;
  caption: string;
}

export interface FigureText {
  title: string;
  provenance: string;
}

export const FIGURE_FONT = "'Source Sans 3', 'DejaVu Sans', Arial, sans-serif";
const INK = '#0b2e32';
const INK_SOFT = '#3f6468';
const PAPER = '#fcfaf5';
const TITLE_H = 34;
const LINE_H = 15;
const PROV_H = 26;

export const escapeXml = (s: string) =>
  s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/** Words wrapped to lines of at most `chars` characters (a long word gets its own line). */
export function wrap(text: string, chars: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/).filter(Boolean)) {
    if (line && line.length + 1 + word.length > chars) {
      lines.push(line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  if (line) lines.push(line);
  return lines;
}

/** Characters per line of caption text at 11.5 px for a width in px (Source Sans averages ≈ 0.5 em). */
export const charsFor = (width: number) => Math.max(30, Math.floor((width - 24) / 5.9));

/** The layout of a figure: where each panel and each caption line goes, and the total height. */
export function figureLayout(panels: readonly { width: number; height: number; caption: string }[]) {
  const width = Math.max(...panels.map((p) => p.width));
  let y = TITLE_H;
  const placed = panels.map((p) => {
    const top = y;
    const lines = wrap(p.caption, charsFor(width));
    y += p.height + 6 + lines.length * LINE_H + 8;
    return { top, lines, captionTop: top + p.height + 6 };
  });
  return { width, height: y + PROV_H, placed, provenanceY: y + 16 };
}

/** The figure as one SVG document: title, panels with captions, provenance. */
export function composeSvg(panels: readonly FigurePanel[], text: FigureText): string {
  const { width, height, placed, provenanceY } = figureLayout(panels);
  const parts: string[] = [];
  parts.push(
    `<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">`,
  );
  parts.push(`<title>${escapeXml(text.title)}</title>`);
  parts.push(`<rect width="100%" height="100%" fill="${PAPER}"/>`);
  parts.push(
    `<text x="12" y="23" font-family="${FIGURE_FONT}" font-size="16" font-weight="600" fill="${INK}">${escapeXml(text.title)}</text>`,
  );
  panels.forEach((p, i) => {
    const at = placed[i];
    // The plot's own SVG, nested at its place (its root <svg> keeps its own coordinate system).
    const inner = p.svg.replace(/^<\?xml[^>]*>\s*/, '').replace(/^<svg\b/, `<svg x="0" y="${at.top}"`);
    parts.push(inner);
    at.lines.forEach((line, k) => {
      parts.push(
        `<text x="12" y="${at.captionTop + 11 + k * LINE_H}" font-family="${FIGURE_FONT}" font-size="11.5" fill="${INK_SOFT}" class="caption">${escapeXml(line)}</text>`,
      );
    });
  });
  parts.push(
    `<text x="12" y="${provenanceY}" font-family="${FIGURE_FONT}" font-size="10" fill="${INK_SOFT}" class="provenance">${escapeXml(text.provenance)}</text>`,
  );
  parts.push('</svg>');
  return parts.join('\n');
}

/** A file name from its parts: letters, digits, dot, dash and underscore; words joined by dashes. */
export function fileNameFor(...parts: (string | null | undefined)[]): string {
  return parts
    .filter((p): p is string => !!p && p.trim() !== '')
    .map((p) =>
      p
        .normalize('NFKD')
        .replace(/[\u0300-\u036f]/g, '')
        .replace(/σ/g, 'sigma')
        .replace(/[^\w.-]+/g, '-')
        .replace(/^-+|-+$/g, ''),
    )
    .filter(Boolean)
    .join('_')
    .slice(0, 120);
}
