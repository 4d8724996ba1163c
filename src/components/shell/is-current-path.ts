/** Whether `pathname` is `prefix` or a page below it ("/studies/4" is below "/studies"). */
export function isCurrentPath(pathname: string, prefix: string): boolean {
  return pathname === prefix || pathname.startsWith(`${prefix}/`);
}
