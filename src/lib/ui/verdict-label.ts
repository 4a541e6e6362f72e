/** Gate outcome of a build, as stored by the server. */
export type Verdict = 'pass' | 'fail';

/**
 * Display words for verdicts. A build "Passed" or "Failed" the gate; the words are past tense because a verdict is
 * about a build that already ran, and they are used everywhere (badges, mails, page titles) so people learn one pair.
 */
export const VERDICT_LABEL: Record<Verdict, string> = {
  pass: 'Passed',
  fail: 'Failed'
};
