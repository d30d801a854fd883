// A drawn figure saved as a file: its SVG pieces (the colour legend and the plot) stacked into one standalone SVG,
// or that SVG painted onto a canvas at twice the size and saved as PNG. Everything happens in the browser.

const SVG_NS = 'http://www.w3.org/2000/svg';

/** One standalone SVG document of every svg element in the figure, stacked top to bottom, with a title line. */
export function figureSvgText(figure: Element, title: string): string {
  const parts = [...figure.querySelectorAll('svg')].filter((svg) => !svg.parentElement?.closest('svg'));
  const width = Math.max(...parts.map((svg) => Number(svg.getAttribute('width')) || svg.getBoundingClientRect().width), 200);
  const titleHeight = 22;
  let y = titleHeight;
  const nested: string[] = [];
  for (const svg of parts) {
    const copy = svg.cloneNode(true) as SVGSVGElement;
    const height = Number(svg.getAttribute('height')) || svg.getBoundingClientRect().height;
    copy.setAttribute('x', '0');
    copy.setAttribute('y', String(y));
    copy.setAttribute('width', String(Number(svg.getAttribute('width')) || width));
    copy.setAttribute('height', String(height));
    nested.push(new XMLSerializer().serializeToString(copy));
    y += height + 6;
  }
  const escaped = title.replace(/&/g, '&amp;').replace(/</g, '&lt;');
  return [
    `<svg xmlns="${SVG_NS}" width="${width}" height="${y}" viewBox="0 0 ${width} ${y}" font-family="Inter, system-ui, sans-serif">`,
    `<rect width="100%" height="100%" fill="#ffffff"/>`,
    `<text x="4" y="15" font-size="13" fill="#1d2733">${escaped}</text>`,
    ...nested,
    '</svg>',
  ].join('\n');
}

function save(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  document.body.append(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

export function downloadSvg(figure: Element, title: string, fileName: string): void {
  save(new Blob([figureSvgText(figure, title)], { type: 'image/svg+xml' }), fileName);
}

export async function downloadPng(figure: Element, title: string, fileName: string, scale = 2): Promise<void> {
  const text = figureSvgText(figure, title);
  const image = new Image();
  const url = URL.createObjectURL(new Blob([text], { type: 'image/svg+xml' }));
  try {
    await new Promise<void>((resolve, reject) => {
      image.onload = () => resolve();
      image.onerror = () => reject(new Error('The figure could not be painted as an image.'));
      image.src = url;
    });
    const canvas = document.createElement('canvas');
    canvas.width = Math.round(image.width * scale);
    canvas.height = Math.round(image.height * scale);
    const context = canvas.getContext('2d');
    if (!context) throw new Error('This browser cannot paint the figure.');
    context.scale(scale, scale);
    context.drawImage(image, 0, 0);
    const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, 'image/png'));
    if (!blob) throw new Error('The figure could not be saved as PNG.');
    save(blob, fileName);
  } finally {
    URL.revokeObjectURL(url);
  }
}
