/** Messages between the app and the analysis worker. Scenarios cross as plain (structured-clone) data. */
import type { RoseResult, Scenario } from '../core';

export type WorkerRequest = { readonly type: 'rose'; readonly id: number; readonly scenario: Scenario; readonly stepDeg: number };

export type WorkerReply =
  | { readonly type: 'progress'; readonly id: number; readonly done: number; readonly total: number }
  | { readonly type: 'rose'; readonly id: number; readonly result: RoseResult; readonly wallMs: number }
  | { readonly type: 'error'; readonly id: number; readonly message: string };
