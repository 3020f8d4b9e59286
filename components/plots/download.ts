/**
 * Saving a figure as a file. Every figure is drawn once, as SVG; the PNG is that SVG drawn into a
 * canvas at 1×, 2× or 4× its size, so both files show exactly what the screen shows. A saved SVG
 * stands alone: theme colours (CSS variables) are written out as the colours on screen and the
 * plot font travels inside it as @font-face data.
 */

/** The pixel densities offered for PNG downloads. */
export const PNG_SCALES = [1, 2, 4] as const;
export type PngScale = (typeof PNG_SCALES)[number];

/** The family name the embedded font carries inside a saved SVG. */
const EMBEDDED_FAMILY = 'Lanewise Plot Sans';

const PAINT_ATTRIBUTES = ['fill', 'stroke', 'stop-color', 'color'] as const;

/** Starts a download of `blob` as `fileName`. */
export function saveBlob(blob: Blob, fileName: string) {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  document.body.append(a);
  a.click();
  a.remove();
  // Revoking at once can cancel the download in some browsers.
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

function blobToDataUrl(blob: Blob): Promise<string> {
  return new Promise((resolve, reject) => {
    const r = new FileReader();
    r.onload = () => resolve(String(r.result));
    r.onerror = () => reject(new Error('the font could not be read'));
    r.readAsDataURL(blob);
  });
}

let fontFaceCss: Promise<string> | null = null;

/**
 * @font-face rules of the page's sans font (next/font serves it under a generated family name),
 * with each file inlined as a data URL and renamed to {@link EMBEDDED_FAMILY}. Read once.
 */
function embeddedFontCss(): Promise<string> {
  fontFaceCss ??= (async () => {
    const stack = getComputedStyle(document.documentElement).getPropertyValue('--font-inter');
    const family = stack
      .split(',')[0]
      ?.trim()
      .replace(/^['"]|['"]$/g, '');
    if (!family) return '';
    const rules: string[] = [];
    for (const sheet of Array.from(document.styleSheets)) {
      let list: CSSRuleList;
      try {
        list = sheet.cssRules;
      } catch {
        continue; // a stylesheet of another origin cannot be read
      }
      for (const rule of Array.from(list)) {
        if (!(rule instanceof CSSFontFaceRule)) continue;
        if (rule.style.getPropertyValue('font-family').replace(/['"]/g, '').trim() !== family)
          continue;
        const src = /url\(["']?([^"')]+)["']?\)/.exec(rule.style.getPropertyValue('src'))?.[1];
        if (!src) continue;
        const res = await fetch(new URL(src, sheet.href ?? location.href));
        if (!res.ok) continue;
        const data = await blobToDataUrl(await res.blob());
        const weight = rule.style.getPropertyValue('font-weight') || 'normal';
        const range = rule.style.getPropertyValue('unicode-range');
        rules.push(
          `@font-face{font-family:'${EMBEDDED_FAMILY}';src:url(${data}) format('woff2');font-weight:${weight};${range ? `unicode-range:${range};` : ''}}`,
        );
      }
    }
    return rules.join('\n');
  })().catch(() => '');
  return fontFaceCss;
}

/** Writes every paint given as a CSS variable as the colour the live element shows. */
function resolvePaints(live: Element, copy: Element) {
  const style = getComputedStyle(live);
  for (const name of PAINT_ATTRIBUTES) {
    const v = copy.getAttribute(name);
    if (v?.includes('var(')) copy.setAttribute(name, style.getPropertyValue(name));
  }
  const kids = live.children;
  const copies = copy.children;
  for (let i = 0; i < kids.length; i++) resolvePaints(kids[i], copies[i]);
}

/** The figure as a standalone SVG document (colours resolved, font embedded). */
export async function svgDocument(svg: SVGSVGElement): Promise<string> {
  const copy = svg.cloneNode(true) as SVGSVGElement;
  resolvePaints(svg, copy);
  copy.setAttribute('xmlns', 'http://www.w3.org/2000/svg');
  copy.removeAttribute('class');
  copy.removeAttribute('style');
  const css = await embeddedFontCss();
  if (css) {
    const style = document.createElementNS('http://www.w3.org/2000/svg', 'style');
    style.textContent = css;
    copy.insertBefore(style, copy.firstChild);
    // An SVG drawn as an image sees no page fonts; the PNG needs the embedded one too.
    const family = copy.getAttribute('font-family');
    copy.setAttribute('font-family', `'${EMBEDDED_FAMILY}', ${family ?? 'sans-serif'}`);
  }
  return `<?xml version="1.0" encoding="UTF-8"?>\n${new XMLSerializer().serializeToString(copy)}`;
}

/** Saves the figure as `fileName` (an .svg file that stands alone). */
export async function saveSvg(svg: SVGSVGElement, fileName: string): Promise<void> {
  saveBlob(new Blob([await svgDocument(svg)], { type: 'image/svg+xml' }), fileName);
}

/**
 * A PNG of an SVG document `width` × `height` user units (CSS pixels) drawn at `scale` device
 * pixels per unit. Rejects with a message if the browser cannot draw it.
 */
export async function svgToPng(
  svgText: string,
  width: number,
  height: number,
  scale: number,
): Promise<Blob> {
  const url = URL.createObjectURL(new Blob([svgText], { type: 'image/svg+xml' }));
  try {
    const img = new Image();
    await new Promise<void>((resolve, reject) => {
      img.onload = () => resolve();
      img.onerror = () => reject(new Error('the browser could not draw the figure'));
      img.src = url;
    });
    const canvas = document.createElement('canvas');
    canvas.width = Math.round(width * scale);
    canvas.height = Math.round(height * scale);
    const ctx = canvas.getContext('2d');
    if (!ctx) throw new Error('this browser has no 2-D canvas');
    ctx.drawImage(img, 0, 0, canvas.width, canvas.height);
    const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, 'image/png'));
    if (!blob) throw new Error('the canvas gave no PNG');
    return blob;
  } finally {
    URL.revokeObjectURL(url);
  }
}

/** The file name of a PNG at `scale` (`stem.png` at 1×, `stem@4x.png` at 4×). */
export const pngFileName = (fileStem: string, scale: number) =>
  scale === 1 ? `${fileStem}.png` : `${fileStem}@${scale}x.png`;

/** Saves the figure as a PNG at `scale` × the width and height of its viewBox (user units). */
export async function savePng(svg: SVGSVGElement, fileStem: string, scale: number): Promise<void> {
  const { width, height } = svg.viewBox.baseVal;
  if (!(width > 0 && height > 0)) throw new Error('the figure has no viewBox to size the PNG');
  const blob = await svgToPng(await svgDocument(svg), width, height, scale);
  saveBlob(blob, pngFileName(fileStem, scale));
}
