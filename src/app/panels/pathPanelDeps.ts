/** What the path panel takes from the core and the drawing state (one import line there). */
export { candidateSpecs, pathPoints, rankCandidates, type LineSpec, type LineSummary, type PathSpec, type RankedCandidate, type Scenario } from '../../core';
export { lineToPath as lineToPathOrNull, candidatesToLines, lineComplete, linesToCandidates, sameCandidates } from '../../view/PathDrawState';
