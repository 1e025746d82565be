/** Only same-site paths may be used after sign-in; anything else (//evil.example, https://...) is dropped. */
export function safeRedirect(target: string | null | undefined, fallback = '/'): string {
  if (!target || !target.startsWith('/') || target.startsWith('//') || target.startsWith('/\\')) return fallback;
  return target;
}
