import type { IntakeLimits } from './build-table';
import { IntakeError } from './intake-error';

const EOCD = 0x06054b50;
const CENTRAL_ENTRY = 0x02014b50;
const MAX_ENTRIES = 10_000;
// Small parts may compress extremely well (e.g. empty styles); only larger ones are judged by ratio.
const RATIO_MIN_BYTES = 1024 * 1024;

export type ZipSummary = { entries: number; compressedBytes: number; uncompressedBytes: number };

function unreadable(): IntakeError {
  return new IntakeError(
    'workbook_unreadable',
    422,
    'The workbook is damaged and cannot be read. Open it in your spreadsheet program, save it as .xlsx again and upload it.',
  );
}

function tooLarge(message: string, details: unknown): IntakeError {
  return new IntakeError('workbook_too_large', 413, message, details);
}

/**
 * Reads the zip's central directory, before any decompression, and refuses workbooks whose parts
 * would unpack to more than the limit or with absurd compression ratios (zip bombs). Zip64 archives
 * are refused too: a genuine staff export never needs them at our size limits.
 */
export function checkZipSizes(bytes: Uint8Array, limits: IntakeLimits): ZipSummary {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  let eocd = -1;
  for (let i = bytes.byteLength - 22; i >= Math.max(0, bytes.byteLength - 22 - 65_535); i -= 1) {
    if (view.getUint32(i, true) === EOCD) {
      eocd = i;
      break;
    }
  }
  if (eocd < 0) throw unreadable();
  const entries = view.getUint16(eocd + 10, true);
  const directorySize = view.getUint32(eocd + 12, true);
  const directoryOffset = view.getUint32(eocd + 16, true);
  if (entries === 0xffff || directoryOffset === 0xffffffff || directorySize === 0xffffffff) {
    throw tooLarge(
      'The workbook is too large to read (zip64 archive). Save it as CSV and upload that instead.',
      {
        zip64: true,
      },
    );
  }
  if (entries > MAX_ENTRIES) {
    throw tooLarge(
      `The workbook has ${entries} parts; the limit is ${MAX_ENTRIES}. Save it as CSV and upload that.`,
      {
        entries,
      },
    );
  }
  if (directoryOffset + directorySize > bytes.byteLength) throw unreadable();

  let offset = directoryOffset;
  let compressedBytes = 0;
  let uncompressedBytes = 0;
  let isWorkbook = false;
  for (let n = 0; n < entries; n += 1) {
    if (offset + 46 > bytes.byteLength || view.getUint32(offset, true) !== CENTRAL_ENTRY) throw unreadable();
    const compressed = view.getUint32(offset + 20, true);
    const uncompressed = view.getUint32(offset + 24, true);
    const nameLength = view.getUint16(offset + 28, true);
    const extraLength = view.getUint16(offset + 30, true);
    const commentLength = view.getUint16(offset + 32, true);
    const name = Buffer.from(bytes.subarray(offset + 46, offset + 46 + nameLength)).toString('utf8');
    if (compressed === 0xffffffff || uncompressed === 0xffffffff) {
      throw tooLarge(
        'The workbook is too large to read (zip64 part). Save it as CSV and upload that instead.',
        {
          zip64: true,
        },
      );
    }
    const ratio = uncompressed / Math.max(compressed, 1);
    if (uncompressed > RATIO_MIN_BYTES && ratio > limits.maxCompressionRatio) {
      throw tooLarge(
        `The workbook part "${name}" unpacks to ${Math.round(ratio)} times its stored size, which genuine workbooks never do. The file was refused as a possible zip bomb; export the data again.`,
        { part: name, ratio: Math.round(ratio), limit: limits.maxCompressionRatio },
      );
    }
    compressedBytes += compressed;
    uncompressedBytes += uncompressed;
    if (uncompressedBytes > limits.maxUncompressedBytes) {
      throw tooLarge(
        `The workbook unpacks to more than ${Math.round(limits.maxUncompressedBytes / 1024 / 1024)} MB. Save it as CSV (or split it) and upload again.`,
        { limitBytes: limits.maxUncompressedBytes },
      );
    }
    if (name === 'xl/workbook.xml' || name === 'xl/workbook.bin') isWorkbook = true;
    offset += 46 + nameLength + extraLength + commentLength;
  }
  if (!isWorkbook) {
    throw new IntakeError(
      'unsupported_file_type',
      415,
      'This is a zip file but not an Excel workbook. Upload the staff export as .xlsx or CSV.',
    );
  }
  return { entries, compressedBytes, uncompressedBytes };
}
