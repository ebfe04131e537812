/** Calendar date of an ISO timestamp as YYYY-MM-DD in local time: unambiguous in any locale. */
export function formatDate(iso: string): string {
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return '—';
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${date.getFullYear()}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}`;
}

/** Time of day on the 24-hour clock, "14:05" or with seconds "14:05:09", in local time: never am/pm. */
export function formatTimeOfDay(ms: number, withSeconds = false): string {
  const date = new Date(ms);
  if (Number.isNaN(date.getTime())) return '—';
  const pad = (n: number) => String(n).padStart(2, '0');
  const hm = `${pad(date.getHours())}:${pad(date.getMinutes())}`;
  return withSeconds ? `${hm}:${pad(date.getSeconds())}` : hm;
}
