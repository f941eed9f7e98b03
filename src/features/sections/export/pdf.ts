/**
 * A small PDF writer of our own (PDF 1.4, ISO 32000-1 structure: header, numbered objects, a
 * cross-reference table, trailer): one page, text in the standard Helvetica font (one of the 14
 * fonts every reader has, so nothing is embedded and nothing is fetched), and raster images as
 * Flate-compressed RGB XObjects. Enough for a figure with its title, caption and provenance; it
 * needs no network service and no library.
 */

export interface PdfText {
  text: string;
  /** Position of the baseline's start, in points from the page's top left. */
  x: number;
  y: number;
  size: number;
  bold?: boolean;
  /** '#rrggbb' */
  colour?: string;
}

export interface PdfImage {
  /** Raw RGB bytes, row by row, top row first. */
  rgb: Uint8Array;
  pixelsWide: number;
  pixelsHigh: number;
  /** Placement in points from the page's top left. */
  x: number;
  y: number;
  width: number;
  height: number;
}

/** Text in WinAnsiEncoding (the standard fonts' encoding); letters it lacks spelled out. */
export function toWinAnsi(text: string): Uint8Array {
  const spelled = text
    .replace(/σ/g, 'sigma')
    .replace(/θ/g, 'theta')
    .replace(/Δ/g, 'Delta')
    .replace(/γ/g, 'gamma')
    .replace(/ρ/g, 'rho')
    .replace(/[₀-₉]/g, (c) => String(c.charCodeAt(0) - 0x2080))
    .replace(/≈/g, '~')
    .replace(/≤/g, '<=')
    .replace(/≥/g, '>=')
    .replace(/−/g, '-')
    .replace(/×/g, 'x');
  const special: Record<string, number> = {
    '–': 0x96,
    '—': 0x97,
    '‘': 0x91,
    '’': 0x92,
    '“': 0x93,
    '”': 0x94,
    '•': 0x95,
    '…': 0x85,
    '€': 0x80,
  };
  const out: number[] = [];
  for (const ch of spelled) {
    const code = ch.codePointAt(0) ?? 63;
    if (special[ch] !== undefined) out.push(special[ch]);
    else if (code >= 0x20 && code <= 0x7e) out.push(code);
    else if (code >= 0xa0 && code <= 0xff)
      out.push(code); // Latin-1: °, µ, ², ³, é…
    else out.push(63); // '?'
  }
  return Uint8Array.from(out);
}

const hex = (bytes: Uint8Array) => Array.from(bytes, (b) => b.toString(16).padStart(2, '0')).join('');
const rgbOf = (c = '#000000') => [1, 3, 5].map((i) => (parseInt(c.slice(i, i + 2), 16) / 255).toFixed(3)).join(' ');
const enc = new TextEncoder();

/** zlib-wrapped deflate (what FlateDecode reads), with the platform's CompressionStream. */
export async function deflate(data: Uint8Array): Promise<Uint8Array> {
  const stream = new Blob([data as BlobPart]).stream().pipeThrough(new CompressionStream('deflate'));
  return new Uint8Array(await new Response(stream).arrayBuffer());
}

/**
 * One page `width` × `height` points with the images and texts given. The text is searchable and
 * selectable (a real text layer), in reading order.
 */
export async function writePdf(
  page: { width: number; height: number; title: string },
  images: readonly PdfImage[],
  texts: readonly PdfText[],
): Promise<Uint8Array> {
  const H = page.height;
  const content: string[] = [];
  images.forEach((im, i) => {
    content.push(
      `q ${im.width.toFixed(2)} 0 0 ${im.height.toFixed(2)} ${im.x.toFixed(2)} ${(H - im.y - im.height).toFixed(2)} cm /Im${i} Do Q`,
    );
  });
  for (const t of texts) {
    content.push(
      `BT /${t.bold ? 'F2' : 'F1'} ${t.size} Tf ${rgbOf(t.colour)} rg ${t.x.toFixed(2)} ${(H - t.y).toFixed(2)} Td <${hex(toWinAnsi(t.text))}> Tj ET`,
    );
  }
  const objects: (Uint8Array | string)[] = [];
  const add = (o: Uint8Array | string) => {
    objects.push(o);
    return objects.length;
  };
  const catalog = add('');
  const pages = add('');
  const font1 = add('<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica /Encoding /WinAnsiEncoding >>');
  const font2 = add('<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica-Bold /Encoding /WinAnsiEncoding >>');
  const imageIds: number[] = [];
  for (const im of images) {
    const data = await deflate(im.rgb);
    const head = enc.encode(
      `<< /Type /XObject /Subtype /Image /Width ${im.pixelsWide} /Height ${im.pixelsHigh} /ColorSpace /DeviceRGB /BitsPerComponent 8 /Filter /FlateDecode /Length ${data.length} >>\nstream\n`,
    );
    imageIds.push(add(concat([head, data, enc.encode('\nendstream')])));
  }
  const stream = enc.encode(content.join('\n'));
  const contents = add(
    concat([enc.encode(`<< /Length ${stream.length} >>\nstream\n`), stream, enc.encode('\nendstream')]),
  );
  const xobjects = imageIds.map((id, i) => `/Im${i} ${id} 0 R`).join(' ');
  const pageObj = add(
    `<< /Type /Page /Parent ${pages} 0 R /MediaBox [0 0 ${page.width.toFixed(2)} ${page.height.toFixed(2)}] /Contents ${contents} 0 R /Resources << /Font << /F1 ${font1} 0 R /F2 ${font2} 0 R >> /XObject << ${xobjects} >> >> >>`,
  );
  const info = add(`<< /Title <feff${utf16hex(page.title)}> /Producer (Sigmaline) >>`);
  objects[catalog - 1] = `<< /Type /Catalog /Pages ${pages} 0 R >>`;
  objects[pages - 1] = `<< /Type /Pages /Kids [${pageObj} 0 R] /Count 1 >>`;

  const chunks: Uint8Array[] = [enc.encode('%PDF-1.4\n%\xe2\xe3\xcf\xd3\n')];
  let offset = chunks[0].length;
  const offsets: number[] = [];
  objects.forEach((o, i) => {
    offsets.push(offset);
    const body = typeof o === 'string' ? enc.encode(o) : o;
    const c = concat([enc.encode(`${i + 1} 0 obj\n`), body, enc.encode('\nendobj\n')]);
    chunks.push(c);
    offset += c.length;
  });
  const xref = [
    `xref\n0 ${objects.length + 1}\n0000000000 65535 f \n`,
    ...offsets.map((o) => `${String(o).padStart(10, '0')} 00000 n \n`),
  ].join('');
  chunks.push(
    enc.encode(
      `${xref}trailer\n<< /Size ${objects.length + 1} /Root ${catalog} 0 R /Info ${info} 0 R >>\nstartxref\n${offset}\n%%EOF\n`,
    ),
  );
  return concat(chunks);
}

function utf16hex(s: string): string {
  let out = '';
  for (let i = 0; i < s.length; i++) out += s.charCodeAt(i).toString(16).padStart(4, '0');
  return out;
}

function concat(parts: readonly Uint8Array[]): Uint8Array {
  const out = new Uint8Array(parts.reduce((s, p) => s + p.length, 0));
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}
