/**
 * Saving an inline SVG figure as a file: the SVG itself, or a PNG made by drawing that SVG into a
 * canvas at a higher pixel density. Both save exactly what is drawn on the page.
 */

function serialise(svg: SVGSVGElement): string {
  const copy = svg.cloneNode(true) as SVGSVGElement;
  copy.setAttribute('xmlns', 'http://www.w3.org/2000/svg');
  copy.removeAttribute('class');
  copy.removeAttribute('style');
  return `<?xml version="1.0" encoding="UTF-8"?>\n${new XMLSerializer().serializeToString(copy)}`;
}

function saveBlob(blob: Blob, fileName: string) {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/** Saves the figure as `fileName` (an .svg file that stands alone). */
export function saveSvg(svg: SVGSVGElement, fileName: string) {
  saveBlob(new Blob([serialise(svg)], { type: 'image/svg+xml' }), fileName);
}

/**
 * Saves the figure as a PNG of `scale` × its width and height in user units (CSS pixels), drawn
 * through an `<img>` of the serialised SVG. Rejects with a message if the browser cannot draw it.
 */
export async function savePng(svg: SVGSVGElement, fileName: string, scale = 2): Promise<void> {
  const width = Number(svg.getAttribute('width'));
  const height = Number(svg.getAttribute('height'));
  const url = URL.createObjectURL(new Blob([serialise(svg)], { type: 'image/svg+xml' }));
  try {
    const img = new Image();
    img.decoding = 'sync';
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
    ctx.scale(scale, scale);
    ctx.drawImage(img, 0, 0, width, height);
    const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, 'image/png'));
    if (!blob) throw new Error('the canvas gave no PNG');
    saveBlob(blob, fileName);
  } finally {
    URL.revokeObjectURL(url);
  }
}
