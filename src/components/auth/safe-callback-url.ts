/**
 * Where to go after signing in. Only a path on this site is accepted: an absolute or
 * protocol-relative URL ("//evil.example") would turn the sign-in page into an open redirect.
 */
export function safeCallbackUrl(value: string | string[] | undefined): string | undefined {
  const candidate = Array.isArray(value) ? value[0] : value;
  if (!candidate || !candidate.startsWith('/') || candidate.startsWith('//') || candidate.startsWith('/\\')) return undefined;
  return candidate;
}
