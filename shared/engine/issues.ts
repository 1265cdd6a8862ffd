/** Problems that stop the ingest. */
export const ERROR_KINDS = [
  'empty-file',
  'no-data-rows',
  'binary-content',
  'corrupt-gzip',
  'line-too-long',
  'missing-columns',
  'invalid-mapping',
  'invalid-settings',
  'not-a-number',
  'missing-value',
  'missing-frame-rate',
  'unsorted',
  'read-failed',
] as const;

/** Problems reported without stopping the ingest (SCIENCE.md quality flags and others). */
export const WARNING_KINDS = [
  'non-finite',
  'field-count',
  'duplicate-frame',
  'time-not-increasing',
  'track-gap',
  'speed-jump',
  'short-track',
  'identity-swap',
  'kinematics-mismatch',
  'few-individuals',
  'non-integer-frame',
  'issues-truncated',
] as const;

export type ErrorKind = (typeof ERROR_KINDS)[number];
export type WarningKind = (typeof WARNING_KINDS)[number];
export type IssueKind = ErrorKind | WarningKind;

export interface Issue {
  kind: IssueKind;
  severity: 'error' | 'warning';
  /** Plain-language description; for row issues it describes the first row. */
  message: string;
  /** First rows concerned (1-based line numbers of the file, header included). */
  rows: number[];
  /**
   * How many rows (or occurrences) are concerned in total. For errors this counts the rows read until the
   * ingest stopped: reading ends after the block of text (about 1 MiB) in which the first error occurs (or after
   * maxErrorRows error rows), so an error's count covers that block, not the rest of the file.
   */
  count: number;
  /** Column concerned, as named in the file, when there is one. */
  column?: string;
}

export function isErrorKind(kind: IssueKind): kind is ErrorKind {
  return (ERROR_KINDS as readonly string[]).includes(kind);
}

/** Formats a row number as in "row 1,204". */
export function rowLabel(row: number): string {
  return `row ${row.toLocaleString('en-US')}`;
}

/** Collects issues by kind (and column), keeping the first rows and an exact count. */
export class IssueCollector {
  private readonly byKey = new Map<string, Issue>();
  errorRows = 0;

  constructor(private readonly maxRows: number) {}

  add(kind: IssueKind, message: string | (() => string), row?: number, column?: string): void {
    const key = column ? `${kind}\u0000${column}` : kind;
    let issue = this.byKey.get(key);
    const severity = isErrorKind(kind) ? 'error' : 'warning';
    if (severity === 'error') this.errorRows++;
    if (!issue) {
      issue = { kind, severity, message: typeof message === 'function' ? message() : message, rows: [], count: 0 };
      if (column !== undefined) issue.column = column;
      this.byKey.set(key, issue);
    }
    issue.count++;
    if (row !== undefined && issue.rows.length < this.maxRows) issue.rows.push(row);
  }

  get hasErrors(): boolean {
    return this.errorRows > 0;
  }

  /** Errors first, then warnings, each in order of first occurrence. */
  list(): { errors: Issue[]; warnings: Issue[] } {
    const all = [...this.byKey.values()];
    return { errors: all.filter((i) => i.severity === 'error'), warnings: all.filter((i) => i.severity === 'warning') };
  }

  /** Drops issues of the given kinds (used when the frame pipeline restarts). */
  clear(kinds: readonly IssueKind[]): void {
    for (const [k, v] of this.byKey) if (kinds.includes(v.kind)) this.byKey.delete(k);
  }
}
