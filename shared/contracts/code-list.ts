// A code list is accepted by what it holds, not by its name: plain text (UTF-8, no NUL byte),
// one Bouwkamp or table code a line, whatever the extension (our own exports are .txt; other
// catalogues use their own). The server and the upload screen ask the same question.

/** Why these bytes are not a plain-text code list, in words; null when they are. */
export function notPlainTextReason(bytes: Uint8Array, isUtf8: (b: Uint8Array) => boolean = decodesAsUtf8): string | null {
  if (bytes.includes(0)) return 'it is not plain text (it contains NUL bytes, as a picture, a PDF or a spreadsheet does)';
  if (!isUtf8(bytes)) return 'it is not plain text in UTF-8 (save it as plain text and upload it again)';
  return null;
}

/** True when the bytes are valid UTF-8 (decoded to find out; the server passes Node's isUtf8, which does not build the text). */
function decodesAsUtf8(bytes: Uint8Array): boolean {
  try {
    new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    return true;
  } catch {
    return false;
  }
}
