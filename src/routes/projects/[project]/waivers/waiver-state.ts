/** A waiver's standing on the page: its stored status, or `expired` for an approved one past its date. */
export type WaiverState = 'proposed' | 'approved' | 'expired' | 'rejected' | 'revoked';

/** Words for each state, as badges and section titles use them. */
export const WAIVER_STATE_LABEL: Record<WaiverState, string> = {
  proposed: 'Waiting',
  approved: 'In force',
  expired: 'Expired',
  rejected: 'Rejected',
  revoked: 'Revoked'
};

/** The page's groups, in reading order, with a sentence on what each means. */
export const WAIVER_GROUPS: { state: WaiverState; title: string; description: string }[] = [
  { state: 'proposed', title: 'Waiting for a decision', description: 'A lead approves or rejects these.' },
  {
    state: 'approved',
    title: 'In force',
    description: 'The gate lets the findings these cover pass, from the next build on.'
  },
  { state: 'expired', title: 'Expired', description: 'Past their expiry date: the gate no longer applies them.' },
  { state: 'rejected', title: 'Rejected', description: 'A lead decided against these.' },
  { state: 'revoked', title: 'Revoked', description: 'Were in force until a lead withdrew them.' }
];

/** History words for each event. */
export const WAIVER_ACTION_LABEL: Record<string, string> = {
  proposed: 'Proposed',
  approved: 'Approved',
  rejected: 'Rejected',
  revoked: 'Revoked',
  expired: 'Expired',
  commented: 'Commented'
};
