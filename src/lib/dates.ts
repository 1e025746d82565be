/**
 * One date format on every page: "2 Dec 2026, 04:25" (with the time) or "2 Dec 2026" (a day), in the
 * reader's time zone. A fixed day-month-year order so a date never reads two ways across pages.
 */
const WHEN = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short' });
const DAY = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium' });

export function formatWhen(iso: string | Date): string {
  return WHEN.format(new Date(iso));
}

export function formatDay(iso: string | Date): string {
  return DAY.format(new Date(iso));
}
