/**
 * A progress line for long command-line work: rewritten in place on a terminal (standard error), silent when
 * the output goes to a file or another program, so logs and --json output stay clean.
 */
export interface Progress {
  /** "label: done/total" (or a step's words) on the one line. */
  update(done: number, total?: number): void;
  step(words: string): void;
  /** Clears the line before the result is printed. */
  done(): void;
}

export function progress(label: string, stream: NodeJS.WriteStream = process.stderr): Progress {
  const on = !!stream.isTTY;
  let last = 0;
  const write = (text: string, force = false) => {
    const now = Date.now();
    if (!on || (!force && now - last < 100)) return;
    last = now;
    stream.write(`\r${text}\x1b[K`);
  };
  return {
    update: (done, total) => write(`${label}: ${done}${total !== undefined ? ` of ${total}` : ''}`, done === total),
    step: (words) => write(`${label}: ${words}`, true),
    done: () => on && stream.write('\r\x1b[K'),
  };
}
