// Reads what a chosen file says about itself, in the browser, to prefill the upload form.

export interface SampleDescription {
  name: string;
  label: string;
  description: string;
  tags: string;
}

/** The header line is small; reading this much is enough and keeps large files out of memory. */
const HEADER_BYTES = 256 * 1024;

/** "jets.run2.jsonl.gz" → "jets.run2". */
export function nameFromFileName(fileName: string): string {
  return fileName.replace(/(\.gz)$/i, '').replace(/\.(jsonl|json|hepmc3?|txt|parquet|arrows?|feather|ipc)$/i, '') || fileName;
}

async function firstText(file: File): Promise<string> {
  const head = file.slice(0, HEADER_BYTES);
  const gzip = new Uint8Array(await head.slice(0, 2).arrayBuffer());
  if (gzip[0] !== 0x1f || gzip[1] !== 0x8b) return head.text();
  // A cut gzip stream ends in an error; what was decompressed before it is all we need.
  const reader = head.stream().pipeThrough(new DecompressionStream('gzip')).pipeThrough(new TextDecoderStream()).getReader();
  let text = '';
  try {
    while (!text.includes('\n')) {
      const { value, done } = await reader.read();
      if (done) break;
      text += value;
    }
  } catch {
    // Truncated on purpose.
  }
  return text;
}

const asText = (value: unknown) => (typeof value === 'string' ? value : '');

/** The sample's name, label, description and tags from a splitfield-particles header, else the file name. */
export async function describeFile(file: File): Promise<SampleDescription> {
  const fallback = { name: nameFromFileName(file.name), label: '', description: '', tags: '' };
  try {
    const header = JSON.parse((await firstText(file)).split('\n', 1)[0]);
    const sample = header?.format === 'splitfield-particles' ? header.sample : null;
    if (!sample || typeof sample !== 'object') return fallback;
    return {
      name: asText(sample.name) || fallback.name,
      label: asText(sample.label),
      description: asText(sample.description),
      tags: Array.isArray(sample.tags) ? sample.tags.filter((tag: unknown) => typeof tag === 'string').join(', ') : '',
    };
  } catch {
    return fallback; // Not JSON on the first line (HepMC3, or one large document): the file name will do.
  }
}
