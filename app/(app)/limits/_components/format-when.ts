// One rendering of a timestamp for server and client alike (locale and time zone would differ
// between the two and break hydration).
export function formatWhen(when: string | Date): string {
  const iso = typeof when === "string" ? when : when.toISOString();
  return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}
