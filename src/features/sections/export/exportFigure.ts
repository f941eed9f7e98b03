import { plotlyLibrary } from '../../../components/plot';
import { composeSvg, figureLayout, type FigurePanel, type FigureText } from './compose';
import { writePdf, type PdfText } from './pdf';

export const EXPORT_FORMATS = ['svg', 'pdf', 'png'] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

export interface ExportSize {
  /** Width of each plot in CSS pixels (1/96 inch). */
  width: number;
  /** Height of each plot in CSS pixels. */
  height: number;
  /** Resolution of the PNG, and of the PDF's figure raster, in dots per inch. */
  dpi: number;
}

export const DEFAULT_EXPORT_SIZE: ExportSize = { width: 1100, height: 480, dpi: 200 };

/** A plot on screen (the library's graph div) and its caption. */
export interface ExportSource {
  graph: HTMLElement;
  caption: string;
}

/** The figure's panels drawn again by the library as SVG, at the asked size. */
async function panelsOf(sources: readonly ExportSource[], size: ExportSize): Promise<FigurePanel[]> {
  const Plotly = await plotlyLibrary();
  return Promise.all(
    sources.map(async (s) => {
      const url = await Plotly.toImage(s.graph, { format: 'svg', width: size.width, height: size.height });
      const comma = url.indexOf(',');
      const body = url.slice(comma + 1);
      const svg = url.slice(0, comma).includes('base64') ? atob(body) : decodeURIComponent(body);
      return { svg, width: size.width, height: size.height, caption: s.caption };
    }),
  );
}

async function rasterise(svg: string, width: number, height: number, scale: number): Promise<HTMLCanvasElement> {
  const img = new Image();
  const url = URL.createObjectURL(new Blob([svg], { type: 'image/svg+xml' }));
  try {
    img.src = url;
    await img.decode();
  } finally {
    URL.revokeObjectURL(url);
  }
  const canvas = document.createElement('canvas');
  canvas.width = Math.round(width * scale);
  canvas.height = Math.round(height * scale);
  const ctx = canvas.getContext('2d')!;
  ctx.fillStyle = '#fcfaf5';
  ctx.fillRect(0, 0, canvas.width, canvas.height);
  ctx.drawImage(img, 0, 0, canvas.width, canvas.height);
  return canvas;
}

/** The figure's bytes in a format, with its MIME type. Title, captions and provenance are in every format. */
export async function figureBytes(
  sources: readonly ExportSource[],
  text: FigureText,
  format: ExportFormat,
  size: ExportSize,
): Promise<Blob> {
  const panels = await panelsOf(sources, size);
  const layout = figureLayout(panels);
  if (format === 'svg') return new Blob([composeSvg(panels, text)], { type: 'image/svg+xml' });
  if (format === 'png') {
    const canvas = await rasterise(composeSvg(panels, text), layout.width, layout.height, size.dpi / 96);
    return new Promise((resolve, reject) =>
      canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('The PNG could not be made.'))), 'image/png'),
    );
  }
  // PDF: the plots as one raster at the asked dpi, the words as real (searchable) text on top.
  const bare = composeSvg(panels, { title: '', provenance: '' }).replace(
    /<text [^>]*class="caption"[^>]*>.*?<\/text>/g,
    '',
  );
  const canvas = await rasterise(bare, layout.width, layout.height, size.dpi / 96);
  const rgba = canvas.getContext('2d')!.getImageData(0, 0, canvas.width, canvas.height).data;
  const rgb = new Uint8Array((rgba.length / 4) * 3);
  for (let i = 0, j = 0; i < rgba.length; i += 4, j += 3) {
    rgb[j] = rgba[i];
    rgb[j + 1] = rgba[i + 1];
    rgb[j + 2] = rgba[i + 2];
  }
  const pt = 0.75; // points per CSS pixel
  const texts: PdfText[] = [{ text: text.title, x: 12 * pt, y: 23 * pt, size: 12, bold: true, colour: '#0b2e32' }];
  layout.placed.forEach((p) =>
    p.lines.forEach((line, k) =>
      texts.push({ text: line, x: 12 * pt, y: (p.captionTop + 11 + k * 15) * pt, size: 8.6, colour: '#3f6468' }),
    ),
  );
  texts.push({ text: text.provenance, x: 12 * pt, y: layout.provenanceY * pt, size: 7.5, colour: '#3f6468' });
  const bytes = await writePdf(
    { width: layout.width * pt, height: layout.height * pt, title: text.title },
    [
      {
        rgb,
        pixelsWide: canvas.width,
        pixelsHigh: canvas.height,
        x: 0,
        y: 0,
        width: layout.width * pt,
        height: layout.height * pt,
      },
    ],
    texts,
  );
  return new Blob([bytes as BlobPart], { type: 'application/pdf' });
}

/** Saves a blob as a file in the browser (no request leaves the page). */
export function saveBlob(blob: Blob, fileName: string) {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}
