/** Today on the device's calendar, as the API writes dates (YYYY-MM-DD). */
export function todayIso(now: Date = new Date()): string {
  const month = String(now.getMonth() + 1).padStart(2, '0');
  const day = String(now.getDate()).padStart(2, '0');
  return `${now.getFullYear()}-${month}-${day}`;
}

const DATE_FORMAT = new Intl.DateTimeFormat('en-GB', {
  day: 'numeric',
  month: 'short',
  year: 'numeric',
  timeZone: 'UTC',
});

/**
 * A job's date (YYYY-MM-DD, a calendar day with no time) in words, "5 Dec 2026", read as the same day
 * wherever the device is.
 */
export function jobDate(iso: string): string {
  const time = Date.parse(`${iso}T00:00:00Z`);
  return Number.isNaN(time) ? iso : DATE_FORMAT.format(time);
}
