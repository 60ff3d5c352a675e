/**
 * Whether next-auth can use a return address (a callbackUrl, or its cookie) without failing:
 * a path on this site, or an http(s) address (next-auth sends other origins home). Anything
 * else it answers with a 500, "a problem with the server configuration".
 */
export function usableCallbackUrl(value: string): boolean {
  if (value.startsWith("/")) return true;
  try {
    return /^https?:$/.test(new URL(value).protocol);
  } catch {
    return false;
  }
}

/** next-auth's cookie that remembers the return address (plain, or __Secure- on https). */
export const CALLBACK_COOKIE = /^(__Secure-)?next-auth\.callback-url$/;
