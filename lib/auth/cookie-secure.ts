/**
 * Whether the session cookie carries `Secure`: whenever the app is served over https (`APP_URL`'s scheme,
 * in any letter case). An unset or unparsable `APP_URL` means a local http setup.
 *
 * @example cookieSecure("https://ordwise.example") // true
 */
export function cookieSecure(appUrl: string | undefined): boolean {
  if (!appUrl) return false;
  try {
    return new URL(appUrl).protocol === "https:";
  } catch {
    return false;
  }
}
