/**
 * Display formats shared by server and browser components. Times are shown in the plant's time zone (the
 * site's `zone`, an IANA name or "UTC") with that zone's short name or offset, so a reading is never taken
 * for another hour: "1 Jun 2026, 16:05 CEST", "1 Jun 2026, 14:05 UTC", "1 Jun 2026, 10:05 GMT-4".
 * Intl applies the IANA rules (summer time included) as the runtime's ICU data holds them.
 */
const valueFormat = new Intl.NumberFormat("en-GB", { maximumSignificantDigits: 4 });

/** One date-time format per zone, made on first use: building one costs far more than formatting with it. */
export function formatPerZone(locale: string, options: Intl.DateTimeFormatOptions): (zone: string) => Intl.DateTimeFormat {
  const formats = new Map<string, Intl.DateTimeFormat>();
  return (zone) => {
    let format = formats.get(zone);
    if (format === undefined) {
      format = new Intl.DateTimeFormat(locale, { ...options, timeZone: zone });
      formats.set(zone, format);
    }
    return format;
  };
}

// dateStyle/timeStyle cannot be combined with timeZoneName, hence the fields one by one.
const timeFormatFor = formatPerZone("en-GB", {
  day: "numeric",
  month: "short",
  year: "numeric",
  hour: "2-digit",
  minute: "2-digit",
  hourCycle: "h23",
  timeZoneName: "short",
});

export function formatValue(value: number): string {
  return valueFormat.format(value);
}

/** An ISO 8601 instant as wall-clock time in `zone` with the zone's short name, e.g. "1 Jun 2026, 16:05 CEST". */
export function formatTime(isoTime: string, zone: string): string {
  return timeFormatFor(zone).format(new Date(isoTime));
}

/** The zone's short name at an instant, as formatTime shows it: "CEST", "GMT", "GMT-4", "UTC". */
export function zoneNameAt(instant: Date, zone: string): string {
  return timeFormatFor(zone).formatToParts(instant).find((part) => part.type === "timeZoneName")?.value ?? zone;
}
