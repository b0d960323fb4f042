/** Only same-site paths are followed after sign-in; anything else falls back to the project list. */
export function safeReturnUrl(candidate: string | null | undefined): string {
  return candidate && candidate.startsWith('/') && !candidate.startsWith('//') && !candidate.startsWith('/sign-') ? candidate : '/projects';
}
