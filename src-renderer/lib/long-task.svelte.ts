// One long operation behind a button: busy flag, progress text and fraction, a cancel that
// aborts the call (and so terminates its worker), and the error or "cancelled" message.
import { CallError, type CallOptions } from './client.ts';

export class LongTask {
  busy = $state(false);
  progress = $state('');
  fraction = $state(NaN);
  error = $state('');
  #abort: AbortController | null = null;

  /** Runs work with the call options it must pass on; errors end up in `error`, never thrown. */
  async run(work: (opts: CallOptions) => Promise<void>, cancelledText: string): Promise<void> {
    this.busy = true;
    this.error = '';
    this.progress = 'starting';
    this.fraction = NaN;
    this.#abort = new AbortController();
    try {
      await work({ signal: this.#abort.signal, onProgress: (f, m) => { this.fraction = f; this.progress = m; } });
    } catch (e) {
      this.error = e instanceof CallError && e.code === 'cancelled' ? cancelledText : (e as Error).message;
    } finally {
      this.busy = false;
      this.progress = '';
      this.#abort = null;
    }
  }

  cancel(): void {
    this.#abort?.abort();
  }
}
