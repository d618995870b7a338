const twoDigits = (value: number) => value.toString().padStart(2, '0');

/** "09:05" (or "09:05:12" with seconds) on this device's clock, as the official reads the time. */
export function clockTime(at: string | number, options: { seconds?: boolean } = {}): string {
  const time = new Date(at);
  const hoursAndMinutes = `${twoDigits(time.getHours())}:${twoDigits(time.getMinutes())}`;
  return options.seconds ? `${hoursAndMinutes}:${twoDigits(time.getSeconds())}` : hoursAndMinutes;
}

/** A span of time as a countdown shows it: "4:05", or "1:02:09" from one hour on. */
export function countdownClock(totalSeconds: number): string {
  const seconds = Math.max(0, totalSeconds);
  const hours = Math.floor(seconds / 3600);
  const minutes = Math.floor((seconds % 3600) / 60);
  const rest = `${twoDigits(seconds % 60)}`;
  return hours > 0 ? `${hours}:${twoDigits(minutes)}:${rest}` : `${minutes}:${rest}`;
}

const weekdays = ['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat'];
const months = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** The day of `at` as seen from `now`: "today", "tomorrow", "yesterday", else "Thu 14 Jan" (device clock). */
export function dayWords(at: number, now: number): string {
  const day = (ms: number) => {
    const date = new Date(ms);
    return Date.UTC(date.getFullYear(), date.getMonth(), date.getDate()) / 86_400_000;
  };
  const offset = day(at) - day(now);
  if (offset === 0) return 'today';
  if (offset === 1) return 'tomorrow';
  if (offset === -1) return 'yesterday';
  const date = new Date(at);
  return `${weekdays[date.getDay()]} ${date.getDate()} ${months[date.getMonth()]}`;
}
