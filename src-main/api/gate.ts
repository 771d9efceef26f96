// The one gatekeeper between callers (IPC, the browser bridge, tests) and the handlers:
// it checks that the operation exists, validates the arguments against the table, then runs
// the handler. Nothing reaches a handler unvalidated.
import { OperationError, type ArgsOf, type CallContext, type Operation, type ResultOf } from './define.ts';
import { ValidationError } from './validate.ts';

export type Handlers<T extends Record<string, Operation<any, any>>> = {
  -readonly [K in keyof T]: (args: ArgsOf<T[K]>, ctx: CallContext) => Promise<ResultOf<T[K]>> | ResultOf<T[K]>;
};

export type SerializedError = { code: OperationError['code']; message: string };

export async function callOperation<T extends Record<string, Operation<any, any>>>(
  table: T,
  handlers: Partial<Handlers<T>>,
  name: unknown,
  rawArgs: unknown,
  ctx: CallContext,
): Promise<unknown> {
  if (typeof name !== 'string' || !Object.prototype.hasOwnProperty.call(table, name)) {
    throw new OperationError('unknown-operation', `unknown operation ${JSON.stringify(String(name)).slice(0, 80)}`);
  }
  const op = table[name];
  let args: unknown;
  try {
    args = op.args.parse(rawArgs, 'arguments');
  } catch (e) {
    if (e instanceof ValidationError) throw new OperationError('bad-arguments', `${name}: ${e.message}`);
    throw e;
  }
  const handler = handlers[name as keyof T];
  if (!handler) throw new OperationError('unknown-operation', `${name}: not available in this build`);
  if (ctx.signal.aborted) throw new OperationError('cancelled', `${name}: cancelled`);
  return await (handler as (a: unknown, c: CallContext) => unknown)(args, ctx);
}

/** Turns any thrown value into the plain error object that crosses the process boundary. */
export function serializeError(e: unknown): SerializedError {
  if (e instanceof OperationError) return { code: e.code, message: e.message };
  if (e instanceof Error) return { code: 'failed', message: e.message };
  return { code: 'failed', message: String(e) };
}
