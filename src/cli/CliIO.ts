/**
 * What a command may use of the outside world, passed in so tests run commands in-process
 * and capture their output.
 */
export interface CliIO {
  /** Writes to standard output as is (include the newline). */
  stdout: (s: string) => void;
  /** Writes to standard error as is (include the newline). */
  stderr: (s: string) => void;
  /** True when stderr is a terminal (progress lines are shown only then). */
  isTTY: boolean;
  /** Milliseconds clock for time budgets and progress pacing. */
  now: () => number;
}
