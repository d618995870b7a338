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
