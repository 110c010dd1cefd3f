/**
 * Display formats shared by server and browser components. Times are shown in UTC and say so, because
 * the server does not know the plant's time zone yet.
 */
const valueFormat = new Intl.NumberFormat("en-GB", { maximumSignificantDigits: 4 });
const timeFormat = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "short", timeZone: "UTC" });

export function formatValue(value: number): string {
  return valueFormat.format(value);
}

/** An ISO 8601 time as "1 Jun 2026, 14:05 UTC". */
export function formatTime(isoTime: string): string {
  return `${timeFormat.format(new Date(isoTime))} UTC`;
}
