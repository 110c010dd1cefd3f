/**
 * DateTime values as Prisma stores them in SQLite: ISO 8601 text in UTC with milliseconds and an explicit
 * offset, "2026-03-01T06:00:00.000+00:00". Code that writes rows without Prisma (the import's bulk path,
 * the benchmarks) must write exactly this text, or Prisma's reads and its comparisons in queries would
 * see a different value.
 */

/** The stored text of an ISO 8601 UTC time ending in "Z", as `toISOString` writes it. */
export function storedTime(isoTime: string): string {
  return `${isoTime.slice(0, -1)}+00:00`;
}

/** The stored text of a time in milliseconds since the epoch. */
export function storedTimeOf(milliseconds: number): string {
  return storedTime(new Date(milliseconds).toISOString());
}

const DAY_MS = 86_400_000;
const DIGITS_2 = Array.from({ length: 100 }, (_, number) => String(number).padStart(2, "0"));
const DIGITS_3 = Array.from({ length: 1000 }, (_, number) => String(number).padStart(3, "0"));

/**
 * `storedTimeOf` for long runs of times, most of them on the same day as the one before (a file of readings
 * in time order): the date part is formatted once per day and the time of day from digit tables, instead
 * of a Date and `toISOString` per call, which was the largest single cost of assembling an imported row.
 * Equal to `storedTimeOf` for every time a Date can hold (test/unit/db/stored-time.test.ts).
 */
export function createStoredTimeFormatter(): (milliseconds: number) => string {
  let day = Number.NaN;
  let datePart = "";
  return (milliseconds) => {
    if (!Number.isInteger(milliseconds)) return storedTimeOf(milliseconds);
    const dayNumber = Math.floor(milliseconds / DAY_MS);
    if (dayNumber !== day) {
      day = dayNumber;
      const midnight = new Date(dayNumber * DAY_MS).toISOString();
      datePart = midnight.slice(0, midnight.indexOf("T") + 1);
    }
    const inDay = milliseconds - dayNumber * DAY_MS;
    const hours = Math.floor(inDay / 3_600_000);
    const minutes = Math.floor(inDay / 60_000) % 60;
    const seconds = Math.floor(inDay / 1000) % 60;
    return `${datePart}${DIGITS_2[hours]}:${DIGITS_2[minutes]}:${DIGITS_2[seconds]}.${DIGITS_3[inDay % 1000]}+00:00`;
  };
}
