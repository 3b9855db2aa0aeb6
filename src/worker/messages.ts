/** Messages between the app and the analysis worker. Scenarios cross as plain (structured-clone) data. */
import type { BuildRow, GroundPlane, HeadingResult, LineSpec, LineSummary, PassResult, RoseResult, Scenario, SolveResult } from '../core';

export type WorkerRequest =
  | { readonly type: 'rose'; readonly id: number; readonly scenario: Scenario; readonly stepDeg: number }
  /** The obstacle pass on the scenario's path, and each station's full solve for the scene. */
  | { readonly type: 'pass'; readonly id: number; readonly scenario: Scenario }
  /** The vehicle as given and each of the scenario's builds, as the compare command runs them. */
  | { readonly type: 'compare'; readonly id: number; readonly scenario: Scenario }
  /** Some of a line sweep's lines (the app spreads a sweep over several workers). */
  | { readonly type: 'lines'; readonly id: number; readonly scenario: Scenario; readonly lines: readonly LineSpec[] }
  /** Some headings of a heading sweep at (xM, yM) on the scenario's ground (spread over workers as a line sweep). */
  | { readonly type: 'headings'; readonly id: number; readonly scenario: Scenario; readonly xM: number; readonly yM: number; readonly ground: GroundPlane; readonly headingsRad: readonly number[] }
  /** The self-contained HTML report; the picture of the 3D view as a data: URL, or null. */
  | {
      readonly type: 'report';
      readonly id: number;
      readonly scenario: Scenario;
      readonly toolVersion: string;
      readonly dateText: string;
      readonly sceneImageDataUrl: string | null;
      /** Units the report is written in (the app's display units). @default the scenario file's */
      readonly units?: 'metric' | 'imperial';
    };

export type WorkerReply =
  | { readonly type: 'progress'; readonly id: number; readonly done: number; readonly total: number; readonly stage?: string }
  | { readonly type: 'rose'; readonly id: number; readonly result: RoseResult; readonly wallMs: number }
  | { readonly type: 'pass'; readonly id: number; readonly result: PassResult; readonly solved: readonly SolveResult[]; readonly wallMs: number }
  | { readonly type: 'compare'; readonly id: number; readonly rows: readonly BuildRow[]; readonly wallMs: number }
  | { readonly type: 'lines'; readonly id: number; readonly summaries: readonly LineSummary[]; readonly wallMs: number }
  | { readonly type: 'report'; readonly id: number; readonly html: string; readonly wallMs: number }
  | { readonly type: 'headings'; readonly id: number; readonly results: readonly HeadingResult[]; readonly wallMs: number }
  | { readonly type: 'error'; readonly id: number; readonly message: string };

/** The result part of each reply, by request type. */
export type ReplyOf<T extends WorkerRequest['type']> = Omit<Extract<WorkerReply, { type: T }>, 'type' | 'id'>;
