/**
 * The name an uploaded file is kept under: its last path segment only, without control characters,
 * at most 200 characters. Qwell never writes uploads to disk, but names travel into exports, mail
 * and download headers, where "../" or a newline could do harm.
 */
export function safeFilename(original: string): string {
  const lastSegment = original.split(/[\\/]/).filter((part) => part !== '' && part !== '.' && part !== '..').pop() ?? '';
  // eslint-disable-next-line no-control-regex
  const cleaned = lastSegment.replace(/[\u0000-\u001f\u007f]/g, '').trim().slice(-200);
  return cleaned === '' ? 'upload' : cleaned;
}
