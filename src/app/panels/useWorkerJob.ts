import { useEffect, useRef, useState } from 'react';
import type { Job, OnProgress } from '../../worker/client';

export interface JobProgress {
  readonly done: number;
  readonly total: number;
}

/**
 * One long analysis at a time for a panel, run off the main thread: its progress while it runs,
 * a message when it fails or is cancelled, cancel on demand and when the panel goes away.
 */
export function useWorkerJob() {
  const [progress, setProgress] = useState<JobProgress | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const job = useRef<Job<unknown> | null>(null);
  useEffect(() => () => job.current?.cancel(), []);
  /** Starts a job (`start` gets the progress callback) and hands its result to `onDone`. */
  const run = <T,>(start: (onProgress: OnProgress) => Job<T>, onDone: (result: T) => void, expectedTotal = 1): void => {
    setMessage(null);
    setProgress({ done: 0, total: expectedTotal });
    const j = start((d, t) => setProgress({ done: d, total: t }));
    job.current = j;
    j.done
      .then(onDone)
      .catch((e: Error) => setMessage(e.message === 'cancelled' ? 'Cancelled.' : `Failed: ${e.message}`))
      .finally(() => {
        if (job.current === j) job.current = null;
        setProgress(null);
      });
  };
  return { progress, message, run, cancel: () => job.current?.cancel() };
}
