/**
 * The hardening tally for the safety tests: inputs tried, refused with a clear message, accepted
 * (and handled safely), hung, crashed, work lost, payloads executed. Printed in the test output
 * (and so in CI's log) as one `[hardening]` line per group; the target is 0 hung, 0 crashed, 0 lost,
 * 0 executed.
 */
export interface Counts {
  tried: number;
  rejected: number;
  accepted: number;
  hung: number;
  crashed: number;
  lost: number;
  executed: number;
}

export type Outcome = 'rejected' | 'accepted' | 'hung' | 'crashed' | 'lost' | 'executed';

export function newCounts(): Counts {
  return { tried: 0, rejected: 0, accepted: 0, hung: 0, crashed: 0, lost: 0, executed: 0 };
}

export function countOutcome(c: Counts, outcome: Outcome): void {
  c.tried++;
  c[outcome]++;
}

export function printCounts(title: string, c: Counts): void {
  console.log(
    `[hardening] ${title}: ${c.tried} tried, ${c.rejected} rejected with a message, ${c.accepted} accepted, ` +
      `${c.hung} hung, ${c.crashed} crashed, ${c.lost} lost work, ${c.executed} executed`,
  );
}
