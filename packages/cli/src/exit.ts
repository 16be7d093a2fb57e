/** Exit statuses of the `onset` command. */
export const EXIT = {
  /** Done, and every spec criterion met. */
  ok: 0,
  /** Done, but a spec criterion was not met. */
  specFailed: 1,
  /** Bad input: the file, an option or the command line. */
  badInput: 2,
  /** The simulation failed on a valid file (no convergence, singular circuit). */
  simulationFailed: 3,
} as const;

/** One of the command's exit statuses (see {@link EXIT}). */
export type ExitStatus = (typeof EXIT)[keyof typeof EXIT];
