/**
 * Exporting a figure: its data as CSV, its chart as a standalone SVG, and that
 * SVG drawn at 2× as PNG. Kept free of React so it can be tested on its own.
 */

// One CSV helper for every export of the app (formula injection neutralised there).
export { csvCell, toCsv, type CsvCell } from '../../shared/csv';

/** A file name from a figure title: lower case, ASCII letters and digits joined by hyphens. */
export function fileStem(title: string): string {
  const stem = title
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '');
  return stem || 'figure';
}

// Presentation properties worth carrying over: the chart library sets some by
// attribute and the page's stylesheet the rest, which a lone SVG file lacks.
const STYLE_PROPERTIES = [
  'fill', 'fill-opacity', 'stroke', 'stroke-width', 'stroke-opacity', 'stroke-dasharray', 'stroke-linecap', 'stroke-linejoin',
  'opacity', 'font-family', 'font-size', 'font-weight', 'font-style', 'font-variant-numeric', 'text-anchor', 'dominant-baseline', 'visibility', 'display',
];

export type SvgExtras = {
  /** Printed above the chart. */
  title?: string;
  /** Legend entries printed below the chart. */
  legend?: { label: string; color: string; dashed?: boolean; marker?: boolean }[];
  /** `@font-face` rules with data: URLs, so the file renders with the page's fonts anywhere. */
  fontCss?: string;
  /** Font used for the title and legend. */
  fontFamily?: string;
};

const SVG_NS = 'http://www.w3.org/2000/svg';
const escapeXml = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/**
 * A standalone SVG document of a rendered chart: computed styles inlined on
 * every element, the title above and the legend below, on a white ground.
 * Returns the markup and its size in CSS pixels.
 */
export function standaloneSvg(svg: SVGSVGElement, extras: SvgExtras = {}): { markup: string; width: number; height: number } {
  const view = svg.ownerDocument.defaultView;
  const box = svg.getBoundingClientRect();
  const w = Math.round(box.width || Number(svg.getAttribute('width')) || 600);
  const h = Math.round(box.height || Number(svg.getAttribute('height')) || 300);
  const clone = svg.cloneNode(true) as SVGSVGElement;
  if (view) {
    const from = [svg, ...Array.from(svg.querySelectorAll('*'))];
    const to = [clone, ...Array.from(clone.querySelectorAll('*'))];
    from.forEach((el, i) => {
      const cs = view.getComputedStyle(el);
      const decl = STYLE_PROPERTIES.map((p) => [p, cs.getPropertyValue(p)] as const)
        .filter(([, v]) => v !== '' && v !== 'normal' && v !== 'auto')
        .map(([p, v]) => `${p}:${v}`)
        .join(';');
      if (decl) to[i].setAttribute('style', decl);
    });
  }
  const font = extras.fontFamily ?? 'Inter, system-ui, sans-serif';
  const top = extras.title ? 28 : 8;
  const legend = extras.legend ?? [];
  const bottom = legend.length ? 10 + 18 * legend.length : 8;
  const height = h + top + bottom;
  clone.setAttribute('x', '0');
  clone.setAttribute('y', String(top));
  clone.setAttribute('width', String(w));
  clone.setAttribute('height', String(h));
  clone.removeAttribute('class');
  const inner = new XMLSerializer().serializeToString(clone);
  const parts = [
    `<svg xmlns="${SVG_NS}" width="${w}" height="${height}" viewBox="0 0 ${w} ${height}">`,
    extras.fontCss ? `<style>${extras.fontCss}</style>` : '',
    `<rect width="100%" height="100%" fill="#ffffff"/>`,
    extras.title ? `<text x="8" y="19" font-family="${escapeXml(font)}" font-size="14" font-weight="600" fill="#1d2a33">${escapeXml(extras.title)}</text>` : '',
    inner,
    ...legend.map((l, i) => {
      const y = top + h + 14 + 18 * i;
      const key = l.marker
        ? `<circle cx="22" cy="${y - 4}" r="3.5" fill="${escapeXml(l.color)}"/>`
        : `<line x1="10" x2="34" y1="${y - 4}" y2="${y - 4}" stroke="${escapeXml(l.color)}" stroke-width="2.5"${l.dashed ? ' stroke-dasharray="5 3"' : ''}/>`;
      return key +
        `<text x="42" y="${y}" font-family="${escapeXml(font)}" font-size="12" fill="#1d2a33">${escapeXml(l.label)}</text>`;
    }),
    '</svg>',
  ];
  return { markup: parts.join(''), width: w, height };
}

/** Draws SVG markup onto a canvas at `scale`× and encodes it as PNG (browser only). */
export async function svgToPng(markup: string, width: number, height: number, scale = 2): Promise<Blob> {
  const url = URL.createObjectURL(new Blob([markup], { type: 'image/svg+xml;charset=utf-8' }));
  try {
    const img = new Image();
    img.decoding = 'sync';
    await new Promise<void>((resolve, reject) => {
      img.onload = () => resolve();
      img.onerror = () => reject(new Error('The chart could not be drawn as an image.'));
      img.src = url;
    });
    const canvas = document.createElement('canvas');
    canvas.width = Math.round(width * scale);
    canvas.height = Math.round(height * scale);
    const ctx = canvas.getContext('2d');
    if (!ctx) throw new Error('This browser cannot draw on a canvas.');
    ctx.scale(scale, scale);
    ctx.drawImage(img, 0, 0, width, height);
    return await new Promise<Blob>((resolve, reject) => canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('The PNG could not be encoded.'))), 'image/png'));
  } finally {
    URL.revokeObjectURL(url);
  }
}

/** Offers a blob as a download under `fileName` (browser only). */
export function downloadBlob(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  a.rel = 'noopener';
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

const blobToDataUrl = (b: Blob) =>
  new Promise<string>((resolve, reject) => {
    const r = new FileReader();
    r.onload = () => resolve(String(r.result));
    r.onerror = () => reject(r.error);
    r.readAsDataURL(b);
  });

let fontCssCache: Promise<string> | null = null;

/**
 * The page's `@font-face` rules for the basic Latin range of `families`, with
 * their font files embedded as data: URLs (fetched once per page). An image
 * drawn from an SVG loads nothing from outside, so fonts must travel inside.
 */
export function embeddedFontCss(families = ['Inter']): Promise<string> {
  fontCssCache ??= (async () => {
    const rules: CSSFontFaceRule[] = [];
    for (const sheet of Array.from(document.styleSheets)) {
      let list: CSSRuleList;
      try {
        list = sheet.cssRules;
      } catch {
        continue; // another origin's sheet
      }
      for (const rule of Array.from(list))
        if (rule instanceof CSSFontFaceRule) {
          const family = rule.style.getPropertyValue('font-family').replace(/["']/g, '').trim();
          const range = rule.style.getPropertyValue('unicode-range');
          if (families.includes(family) && (!range || /U\+0+-0*FF\b/i.test(range))) rules.push(rule);
        }
    }
    const out: string[] = [];
    for (const rule of rules) {
      const src = rule.style.getPropertyValue('src');
      const m = /url\(["']?([^"')]+)["']?\)/.exec(src);
      if (!m) continue;
      try {
        const res = await fetch(new URL(m[1], rule.parentStyleSheet?.href ?? document.baseURI));
        if (!res.ok) continue;
        const data = await blobToDataUrl(await res.blob());
        const st = rule.style;
        out.push(`@font-face{font-family:"${st.getPropertyValue('font-family').replace(/["']/g, '').trim()}";font-style:${st.getPropertyValue('font-style') || 'normal'};font-weight:${st.getPropertyValue('font-weight') || '400'};src:url("${data}")}`);
      } catch {
        // A font that cannot be fetched falls back to the viewer's sans-serif.
      }
    }
    return out.join('\n');
  })();
  return fontCssCache;
}
