/** The error of class `kind` that `f` throws; fails the test when it throws nothing or something else. */
export function thrownBy<E>(kind: abstract new (...args: never[]) => E, f: () => unknown): E {
  try {
    f();
  } catch (error) {
    if (error instanceof kind) return error;
    throw error;
  }
  throw new Error(`nothing was thrown (expected a ${kind.name})`);
}
