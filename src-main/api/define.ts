// The shape of one operation in the operation table: a validator for its arguments and a
// phantom type for its result. The table itself is in ./table.ts.
import type { Validator } from './validate.ts';

export interface Operation<A, R> {
  /** One line for people: what the operation does. */
  summary: string;
  /** Validates the (untrusted) arguments before any handler runs. */
  args: Validator<A>;
  /** Long-running: runs as a job with progress and cancellation. */
  long: boolean;
  /** Phantom field carrying the result type; never set at run time. */
  readonly _result?: R;
}

export function operation<A, R>(summary: string, args: Validator<A>, opts: { long?: boolean } = {}): Operation<A, R> {
  return { summary, args, long: opts.long ?? false };
}

export type ArgsOf<O> = O extends Operation<infer A, unknown> ? A : never;
export type ResultOf<O> = O extends Operation<unknown, infer R> ? R : never;

/** Progress reported by a long operation. */
export interface Progress {
  /** 0..1, or NaN when unknown. */
  fraction: number;
  message: string;
}

/** What a handler gets besides its arguments. */
export interface CallContext {
  /** Aborted when the user cancels (long operations must poll or pass it on). */
  signal: AbortSignal;
  progress: (p: Progress) => void;
}

/** The error sent back to the caller: a message for people, a code for programs. */
export class OperationError extends Error {
  override name = 'OperationError';
  constructor(readonly code: 'unknown-operation' | 'bad-arguments' | 'failed' | 'cancelled' | 'forbidden', message: string) {
    super(message);
  }
}
