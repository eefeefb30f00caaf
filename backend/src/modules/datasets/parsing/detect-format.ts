import iconv from 'iconv-lite';
import { IntakeError } from './intake-error';

export type DetectedFile =
  | { kind: 'xlsx' }
  | {
      kind: 'csv';
      text: string;
      encoding: 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252';
      warnings: string[];
    };

const ZIP = [0x50, 0x4b, 0x03, 0x04];
const EMPTY_ZIP = [0x50, 0x4b, 0x05, 0x06];
const CFB = [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1];
const REEXPORT =
  'Save it from your spreadsheet program as "Excel Workbook (.xlsx)" or "CSV UTF-8" and upload again.';

function startsWith(bytes: Uint8Array, signature: number[]): boolean {
  return signature.every((byte, i) => bytes[i] === byte);
}

/** Whether the bytes start like a zip (an XLSX workbook), without reading further. */
export function looksLikeZip(bytes: Uint8Array): boolean {
  return startsWith(bytes, ZIP) || startsWith(bytes, EMPTY_ZIP);
}

function containsUtf16(bytes: Uint8Array, text: string): boolean {
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).includes(Buffer.from(text, 'utf16le'));
}

/**
 * Decides what an upload is from its bytes, never from its name: an XLSX workbook is a zip, a CSV
 * is text. Text is returned decoded; anything converted says so in `warnings`.
 */
export function detectFileFormat(bytes: Uint8Array): DetectedFile {
  if (bytes.byteLength === 0) {
    throw new IntakeError('file_empty', 422, 'The file is empty. Export the staff list again and upload it.');
  }
  if (looksLikeZip(bytes)) return { kind: 'xlsx' };
  if (startsWith(bytes, CFB)) {
    // An encrypted .xlsx is stored inside an OLE compound file with an "EncryptedPackage" stream.
    if (containsUtf16(bytes, 'EncryptedPackage') || containsUtf16(bytes, 'EncryptionInfo')) {
      throw new IntakeError(
        'workbook_encrypted',
        422,
        'The workbook is password-protected, so it cannot be read. Open it, remove the password, save it as .xlsx and upload it again.',
      );
    }
    throw new IntakeError(
      'unsupported_file_type',
      415,
      `This looks like an old-style .xls workbook, which Coppice does not read. ${REEXPORT}`,
    );
  }

  const warnings: string[] = [];
  if (startsWith(bytes, [0xff, 0xfe]) || startsWith(bytes, [0xfe, 0xff])) {
    const encoding = bytes[0] === 0xff ? 'utf-16le' : 'utf-16be';
    const text = iconv.decode(Buffer.from(bytes.subarray(2)), encoding);
    warnings.push(`The file was encoded as ${encoding.toUpperCase()}; it was converted to UTF-8.`);
    return { kind: 'csv', text: checkText(text), encoding, warnings };
  }

  const body = startsWith(bytes, [0xef, 0xbb, 0xbf]) ? bytes.subarray(3) : bytes;
  const head = body.subarray(0, 8192);
  if (head.includes(0)) {
    throw new IntakeError(
      'unsupported_file_type',
      415,
      `This file is neither an Excel workbook (.xlsx) nor a text CSV file (it may be UTF-16 without a byte-order mark, or not a spreadsheet at all). ${REEXPORT}`,
    );
  }
  try {
    const text = new TextDecoder('utf-8', { fatal: true }).decode(body);
    return { kind: 'csv', text: checkText(text), encoding: 'utf-8', warnings };
  } catch {
    // Not valid UTF-8: the usual culprit is a spreadsheet program saving "CSV" in Windows-1252.
    const text = iconv.decode(Buffer.from(body), 'win1252');
    warnings.push(
      'The file was not UTF-8; it was read as Windows-1252 (Western European) and converted to UTF-8.',
    );
    return { kind: 'csv', text: checkText(text), encoding: 'windows-1252', warnings };
  }
}

function checkText(text: string): string {
  const sample = text.slice(0, 8192);
  // biome-ignore lint/suspicious/noControlCharactersInRegex: looking for binary content on purpose
  const controls = sample.match(/[\u0000-\u0008\u000B\u000E-\u001F\u007F]/g)?.length ?? 0;
  if (controls > 0 && controls / Math.max(sample.length, 1) > 0.01) {
    throw new IntakeError(
      'unsupported_file_type',
      415,
      `This file does not look like a spreadsheet export (it contains binary data). ${REEXPORT}`,
    );
  }
  if (text.trim() === '') {
    throw new IntakeError(
      'file_empty',
      422,
      'The file contains no data. Export the staff list again and upload it.',
    );
  }
  return text;
}
