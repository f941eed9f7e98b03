/**
 * The password policy as the server states it (at least 10 characters, not all of one
 * character class), checked before sending so the person hears it at once. The server
 * has the last word and its message replaces this one.
 */
export function passwordProblem(password: string): string | null {
  if (password.length < 10) return 'Use at least 10 characters.';
  const classes = [/[a-z]/, /[A-Z]/, /[0-9]/, /[^A-Za-z0-9]/].filter((re) => re.test(password)).length;
  if (classes < 2) return 'Mix at least two kinds of character: lower case, upper case, digits, symbols.';
  return null;
}
