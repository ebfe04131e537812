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

/** One signature checked against its sealed report as stored. */
export interface SignatureCheck {
  signatureId: number;
  revision: number;
  interpretationVersion: number;
  signerName: string;
  /** The hash the signature recorded. */
  recordedHash: string;
  /** The SHA-256 of the sealed snapshot as stored now; null when the signature predates sealed snapshots. */
  snapshotHash: string | null;
  /** The stored snapshot still hashes to what was signed. */
  matches: boolean;
  /** The signed PDF's bytes still hash to what was recorded at signing (null when there is none). */
  pdfMatches: boolean | null;
}

/** GET /api/runs/:id/verify */
export interface Verification {
  runId: number;
  /** The newest signature's revision and interpretation version. */
  revision: number;
  interpretationVersion: number;
  recordedHash: string;
  /** The newest signature's snapshot hashed again from storage. */
  currentHash: string;
  /** Every signature of every revision matches its sealed snapshot and PDF as stored. */
  matches: boolean;
  signatures: SignatureCheck[];
  /** Whether today's live data still match the newest sealed snapshot; drift does not change what was signed. */
  live: { matches: boolean; hash: string; changed: string[]; message: string };
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
