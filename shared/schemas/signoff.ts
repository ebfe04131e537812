/** Review, sign-off and signed reports: what the API answers, used by the server and the client alike. */

/** Where a run stands in review: being worked on, submitted for review, or signed (and so locked). */
export const SIGNOFF_STATES = ['draft', 'in-review', 'signed'] as const;
export type SignoffState = (typeof SIGNOFF_STATES)[number];

/** What a signature means: the signer checked the work, or approves it for issue. */
export const SIGNATURE_MEANINGS = ['reviewed', 'approved'] as const;
export type SignatureMeaning = (typeof SIGNATURE_MEANINGS)[number];

/** Why a signed run was opened again: one entry per revision after the first. */
export interface RevisionNote {
  revision: number;
  reason: string;
  userId: number;
  at: string;
}

export interface Signature {
  id: number;
  revision: number;
  interpretationVersion: number;
  userId: number | null;
  signerName: string;
  meaning: SignatureMeaning;
  dataHash: string;
  signedAt: string;
}

/** GET /api/runs/:id/signoff */
export interface SignoffView {
  runId: number;
  state: SignoffState;
  revision: number;
  interpretationVersion: number | null;
  submittedBy: { id: number; name: string } | null;
  submittedAt: string | null;
  /** Every signature of every revision, oldest first. */
  signatures: Signature[];
  /** Why each later revision was opened. */
  revisions: RevisionNote[];
}

/** GET /api/runs/:id/verify */
export interface Verification {
  runId: number;
  revision: number;
  interpretationVersion: number;
  recordedHash: string;
  currentHash: string;
  matches: boolean;
}

/** One signed report (GET /api/reports). */
export interface ReportListItem {
  runId: number;
  projectId: number;
  projectCode: string;
  projectName: string;
  organizationName: string;
  pitId: string;
  planName: string;
  testDate: string | null;
  revision: number;
  signedAt: string | null;
}
