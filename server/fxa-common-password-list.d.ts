/** fxa-common-password-list ships no types. */
declare module 'fxa-common-password-list' {
  /** True when the password is on the list (exact, case-sensitive). */
  const list: { test(password: string): boolean };
  export default list;
}
