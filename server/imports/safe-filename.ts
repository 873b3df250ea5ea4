/**
 * The name an uploaded file is kept under: its last path segment only, without control characters,
 * at most 200 characters. Qwell never writes uploads to disk, but names travel into exports, mail
 * and download headers, where "../" or a newline could do harm.
 */
export function safeFilename(original: string): string {
  const lastSegment = original.split(/[\\/]/).filter((part) => part !== '' && part !== '.' && part !== '..').pop() ?? '';
  // Control characters (C0, DEL, C1) and the invisible ones that reorder or hide text on screen
  // (bidirectional overrides and isolates, zero-width characters) are dropped; the rest is kept as sent, in NFC.
  // eslint-disable-next-line no-control-regex
  const cleaned = lastSegment.normalize('NFC').replace(/[\u0000-\u001f\u007f-\u009f\u200b-\u200f\u202a-\u202e\u2066-\u2069\ufeff]/g, '').trim().slice(-200);
  return cleaned === '' ? 'upload' : cleaned;
}
