// The uploaded file's name is only a label (files are stored under generated names), but a name that tries to
// point elsewhere, or that reads differently from what it is, is refused outright rather than quietly changed.
import { bidiControlIn, bidiControlMessage } from '@/lib/api/text-rules';

export const FILE_NAME_MAX_BYTES = 255;

/** Why the name cannot be accepted, or null when it can. */
export function fileNameProblem(name: string): string | null {
  if (name.trim() === '') return 'the file name is empty';
  if (/[/\\]/.test(name)) return 'the file name must not contain path separators (/ or \\)';
  if (name.includes('..')) return 'the file name must not contain ".."';
  if (/[\u0000-\u001f\u007f]/.test(name)) return 'the file name must not contain control characters';
  if (bidiControlIn(name) !== null) return bidiControlMessage('the file name', name);
  if (Buffer.byteLength(name) > FILE_NAME_MAX_BYTES) return `the file name must be at most ${FILE_NAME_MAX_BYTES} bytes`;
  return null;
}
