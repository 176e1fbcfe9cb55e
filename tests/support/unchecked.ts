/**
 * The one place a test states a type its value does not have: a spec the types forbid, to prove the
 * code refuses it at run time, or a library's private field the test must reach (a socket to pause).
 * Everything else in the repository gets its types from parsing, never from a double cast.
 */
export function unchecked<T>(value: unknown): T {
  return value as T;
}
