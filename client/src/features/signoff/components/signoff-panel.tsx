import { type FormEvent, useState } from 'react';
import { Button } from '../../../components/button';
import { FormError, FormNotice } from '../../../components/form-alert';
import { SelectField, TextAreaField, TextField } from '../../../components/form-field';
import { isApiError } from '../../../lib/api-client';
import {
  reportPdfUrl,
  type SignatureMeaning,
  type SignoffView,
  useReopenRun,
  useSendReport,
  useSignRun,
  useSubmitForReview,
  useVerification,
} from '../api/signoff';

const STATE_TEXT: Record<SignoffView['state'], string> = {
  draft: 'Draft — not yet submitted for review',
  'in-review': 'Submitted for review',
  signed: 'Signed — the run’s data and interpretation are locked',
};

const MEANINGS = [
  { value: 'reviewed', label: 'Reviewed — I checked the work' },
  { value: 'approved', label: 'Approved — for issue to the client' },
];

/** When and by whom, in UTC as recorded. */
const utc = (iso: string) => `${iso.replace('T', ' ').replace(/\.\d+Z$/, '')} UTC`;

function SignForm({ runId }: { runId: number }) {
  const sign = useSignRun(runId);
  const [password, setPassword] = useState('');
  const [meaning, setMeaning] = useState<SignatureMeaning | ''>('');
  const [problems, setProblems] = useState<{ password?: string; meaning?: string }>({});
  const field = isApiError(sign.error) ? sign.error.field : undefined;
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const found = { password: password ? undefined : 'Enter your password to sign.', meaning: meaning ? undefined : 'Say what your signature means.' };
    setProblems(found);
    if (found.password || found.meaning) return;
    sign.mutate({ password, meaning: meaning as SignatureMeaning }, { onSettled: () => setPassword('') });
  };
  return (
    <form onSubmit={submit} aria-label="Sign" className="flex max-w-md flex-col gap-3">
      <SelectField
        label="Meaning of the signature"
        options={MEANINGS}
        placeholder="Choose…"
        value={meaning}
        onChange={(e) => setMeaning(e.target.value as SignatureMeaning)}
        error={problems.meaning ?? (field === 'meaning' ? sign.error?.message : undefined)}
      />
      <TextField
        label="Your password"
        type="password"
        autoComplete="current-password"
        value={password}
        onChange={(e) => setPassword(e.target.value)}
        error={problems.password ?? (field === 'password' ? sign.error?.message : undefined)}
        hint="Signing asks for your password again."
      />
      <FormError message={sign.error && !field ? sign.error.message : undefined} />
      <div>
        <Button type="submit" busy={sign.isPending} busyLabel="Signing…">
          Sign
        </Button>
      </div>
    </form>
  );
}

/** Reopen a signed run as a new revision, or withdraw one in review to draft (both with a reason). */
function ReopenForm({ runId, withdraw = false }: { runId: number; withdraw?: boolean }) {
  const reopen = useReopenRun(runId);
  const [reason, setReason] = useState('');
  const [problem, setProblem] = useState<string>();
  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (!reason.trim()) return setProblem(withdraw ? 'Say why the run goes back to draft.' : 'Say why the signed run must change.');
    setProblem(undefined);
    reopen.mutate({ reason: reason.trim() }, { onSuccess: () => setReason('') });
  };
  return (
    <form onSubmit={submit} aria-label={withdraw ? 'Withdraw to draft' : 'Reopen as a new revision'} className="flex max-w-xl flex-col gap-3">
      <TextAreaField
        label={withdraw ? 'Reason to withdraw from review' : 'Reason for a new revision'}
        value={reason}
        maxLength={500}
        onChange={(e) => setReason(e.target.value)}
        error={problem ?? (isApiError(reopen.error) && reopen.error.field === 'reason' ? reopen.error.message : undefined)}
        hint={withdraw ? 'While in review the readings, notes and interpretation are locked; withdraw to change them.' : 'The signatures so far stay on record.'}
      />
      <FormError message={reopen.error && !(isApiError(reopen.error) && reopen.error.field) ? reopen.error.message : undefined} />
      <div>
        <Button type="submit" variant="secondary" busy={reopen.isPending} busyLabel={withdraw ? 'Withdrawing…' : 'Reopening…'}>
          {withdraw ? 'Withdraw to draft' : 'Reopen as revision'}
        </Button>
      </div>
    </form>
  );
}

function Verify({ runId }: { runId: number }) {
  const [asked, setAsked] = useState(false);
  const check = useVerification(runId, asked);
  return (
    <div className="flex flex-col gap-2">
      <div>
        <Button variant="secondary" busy={check.isFetching} busyLabel="Checking…" onClick={() => (asked ? void check.refetch() : setAsked(true))}>
          Verify the data against the signature
        </Button>
      </div>
      {check.data &&
        (check.data.matches ? (
          <FormNotice>Every signature matches its sealed report (newest: revision {check.data.revision}).</FormNotice>
        ) : (
          <FormError
            message={`The data no longer match the signed hash (recorded ${check.data.recordedHash.slice(0, 12)}…, now ${check.data.currentHash.slice(0, 12)}…).`}
          />
        ))}
      {check.data?.live?.matches === false && <FormError message={check.data.live.message} />}
      <FormError message={check.error ? (check.error as Error).message : undefined} />
    </div>
  );
}

function SendReport({ runId }: { runId: number }) {
  const send = useSendReport(runId);
  return (
    <div className="flex flex-col gap-2">
      <div>
        <Button busy={send.isPending} busyLabel="Sending…" onClick={() => send.mutate()}>
          E-mail the report to the client
        </Button>
      </div>
      {send.isSuccess && (
        <FormNotice>
          Sent to {send.data.to.join(', ')} with {send.data.attachments.join(' and ')}.
        </FormNotice>
      )}
      <FormError message={send.error?.message} />
    </div>
  );
}

/** Review state, signatures and the actions the state allows. `canSign`: engineers and admins. */
export function SignoffPanel({ view, canSign }: { view: SignoffView; canSign: boolean }) {
  const submit = useSubmitForReview(view.runId);
  return (
    <div className="flex flex-col gap-6">
      <section aria-labelledby="signoff-state">
        <h2 id="signoff-state" className="mb-2 text-xl font-bold">
          Revision {view.revision}: {STATE_TEXT[view.state]}
        </h2>
        {view.interpretationVersion !== null && view.state !== 'draft' && (
          <p>
            Interpretation version {view.interpretationVersion}
            {view.submittedBy && view.submittedAt ? `, submitted by ${view.submittedBy.name} at ${utc(view.submittedAt)}` : ''}.
          </p>
        )}
        <p className="mt-2">
          <a href={reportPdfUrl(view.runId)} className="font-semibold">
            Download the PDF report
          </a>
        </p>
      </section>

      <section aria-labelledby="signatures">
        <h2 id="signatures" className="mb-2 text-xl font-bold">
          Signatures
        </h2>
        {view.signatures.length === 0 ? (
          <p>None yet.</p>
        ) : (
          <table className="w-full border-collapse text-left">
            <thead>
              <tr className="border-b-2 border-neutral-700">
                <th className="py-1 pr-3">Revision</th>
                <th className="py-1 pr-3">Signed by</th>
                <th className="py-1 pr-3">Meaning</th>
                <th className="py-1 pr-3">When</th>
                <th className="py-1">SHA-256 of the data</th>
              </tr>
            </thead>
            <tbody>
              {view.signatures.map((s) => (
                <tr key={s.id} className="border-b border-neutral-300 align-top">
                  <td className="py-1 pr-3 font-mono">{s.revision}</td>
                  <td className="py-1 pr-3">{s.signerName}</td>
                  <td className="py-1 pr-3">{s.meaning}</td>
                  <td className="py-1 pr-3 font-mono">{utc(s.signedAt)}</td>
                  <td className="py-1 font-mono text-sm break-all">{s.dataHash}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        {view.revisions.length > 0 && (
          <ul className="mt-3 list-disc pl-6">
            {view.revisions.map((r) => (
              <li key={r.revision}>
                Revision {r.revision} opened {utc(r.at)}: {r.reason}
              </li>
            ))}
          </ul>
        )}
        {view.signatures.length > 0 && (
          <div className="mt-3">
            <Verify runId={view.runId} />
          </div>
        )}
      </section>

      {canSign && (
        <section aria-labelledby="signoff-actions" className="flex flex-col gap-4">
          <h2 id="signoff-actions" className="text-xl font-bold">
            Next step
          </h2>
          {view.state !== 'signed' && (
            <div className="flex flex-col gap-2">
              <div>
                <Button
                  variant={view.state === 'draft' ? 'primary' : 'secondary'}
                  busy={submit.isPending}
                  busyLabel="Submitting…"
                  onClick={() => submit.mutate(undefined)}
                >
                  {view.state === 'draft' ? 'Submit the newest interpretation for review' : 'Submit the newest interpretation again'}
                </Button>
              </div>
              <FormError message={submit.error?.message} />
            </div>
          )}
          {/* One signature per revision, by someone other than the submitter (the server checks both). */}
          {view.state === 'in-review' && (
            <>
              <SignForm runId={view.runId} />
              <ReopenForm runId={view.runId} withdraw />
            </>
          )}
          {view.state === 'signed' && (
            <>
              <SendReport runId={view.runId} />
              <ReopenForm runId={view.runId} />
            </>
          )}
        </section>
      )}
    </div>
  );
}
