// A job's answer whose buffers are moved to the main thread rather than copied (megabytes of stored JSON):
// the job returns `withTransfer(value, [bytes.buffer])`, and the main thread receives `value`.
import { move, transferableSymbol, valueSymbol } from 'piscina';

export function withTransfer<T extends object>(value: T, buffers: ArrayBuffer[]): T {
  return move({ [transferableSymbol]: buffers, [valueSymbol]: value } as never) as unknown as T;
}
