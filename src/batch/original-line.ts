/**
 * A row's original fields as one line of the output, each as it stood in the input wherever the output
 * can hold it so: the rule the README's Batches section states.
 */
import { csvLine } from '../output/csv.ts';
import type { Delimiter, InputRecord } from './records.ts';

/**
 * The first `width` original fields (a short row padded with empty ones), joined by the input's delimiter:
 * - a field the input quoted is written quoted the same way (RFC 4180 §2.5–2.7), so its bytes come back;
 * - in a tab-separated file an unquoted field is written as it stood, quote marks and all (tab-separated
 *   values have no quoting, so a `"` there is an ordinary character);
 * - otherwise a value is written as it stood unless RFC 4180 forbids it unquoted (§2.5: a quote mark;
 *   §2.6: a line end or the delimiter), and then it is quoted, which reads back to the same value.
 * @example originalLine({ fields: ['5" N', 'x'], quoted: [false, true], line: 2 }, 2, '\t') // '5" N\t"x"'
 */
export function originalLine(record: InputRecord, width: number, delimiter: Delimiter): string {
  const parts = new Array<string>(width);
  for (let i = 0; i < width; i++) {
    const value = record.fields[i] ?? '';
    if (record.quoted[i]) parts[i] = `"${value.replaceAll('"', '""')}"`;
    else if (delimiter === '\t' && !record.splitAsWritten) parts[i] = value;
    else parts[i] = needsQuotes(value, delimiter) ? csvLine([value], delimiter) : value;
  }
  return parts.join(delimiter);
}

function needsQuotes(value: string, delimiter: Delimiter): boolean {
  return value.includes('"') || value.includes(delimiter) || value.includes('\n') || value.includes('\r');
}
