import { isApiError } from '../lib/api-client';

export type ErrorNoticeProps = {
  error: unknown;
  /** what failed, in the user's words ("The dataset was not uploaded") */
  title?: string;
  /** how many detail lines to list before summarising the rest */
  maxDetails?: number;
};

function describeDetail(detail: unknown): string {
  if (typeof detail === 'string') return detail;
  if (typeof detail === 'number' || typeof detail === 'boolean') return String(detail);
  if (detail && typeof detail === 'object') {
    const d = detail as Record<string, unknown>;
    const text = d.message ?? d.reason ?? d.error;
    const where =
      d.row !== undefined
        ? `Row ${d.row}`
        : d.column !== undefined
          ? `Column ${d.column}`
          : Array.isArray(d.path)
            ? d.path.join('.')
            : d.path !== undefined
              ? String(d.path)
              : d.field !== undefined
                ? String(d.field)
                : undefined;
    if (typeof text === 'string') return where ? `${where}: ${text}` : text;
    return JSON.stringify(detail);
  }
  return String(detail);
}

/** Details may be a list (row errors, zod issues) or an object of named problems. */
export function detailLines(details: unknown): string[] {
  if (details === undefined || details === null) return [];
  if (Array.isArray(details)) return details.map(describeDetail);
  if (typeof details === 'object') {
    const d = details as Record<string, unknown>;
    for (const key of ['rows', 'errors', 'issues']) {
      if (Array.isArray(d[key])) return (d[key] as unknown[]).map(describeDetail);
    }
    return Object.entries(d).map(([key, value]) =>
      typeof value === 'string' || typeof value === 'number'
        ? `${key}: ${value}`
        : `${key}: ${JSON.stringify(value)}`,
    );
  }
  return [describeDetail(details)];
}

export function ErrorNotice({ error, title = 'Something went wrong', maxDetails = 20 }: ErrorNoticeProps) {
  const message = isApiError(error)
    ? error.message
    : error instanceof Error
      ? error.message
      : 'An unexpected error occurred.';
  const lines = isApiError(error) ? detailLines(error.details) : [];
  const shown = lines.slice(0, maxDetails);
  return (
    <div
      role="alert"
      className="rounded-md border border-signal-200 bg-signal-50 px-4 py-3 text-sm text-slate-900"
    >
      <p className="font-semibold text-signal-700">{title}</p>
      <p className="mt-1">{message}</p>
      {shown.length > 0 && (
        <ul className="mt-2 list-disc space-y-0.5 pl-5">
          {shown.map((line, i) => (
            // biome-ignore lint/suspicious/noArrayIndexKey: detail lines may repeat and never reorder
            <li key={i}>{line}</li>
          ))}
        </ul>
      )}
      {lines.length > shown.length && (
        <p className="mt-1 text-slate-600">…and {lines.length - shown.length} more.</p>
      )}
    </div>
  );
}
