import type { UltimateChoice } from '@shared/interpretation/ultimate-standing';
import { type FormEvent, useState } from 'react';
import { Button } from '../../../components/button';
import { FormError, FormNotice } from '../../../components/form-alert';
import { SelectField, TextAreaField } from '../../../components/form-field';
import { isApiError } from '../../../lib/api-client';
import { useSaveInterpretation } from '../api/interpretation-versions';
import type { InterpretationSettings } from '../utils/interpretation-settings';
import { METHOD_OPTIONS } from './settings-form';

/** Saves the current settings with the engineer's chosen ultimate method and why, as the run's next interpretation version. */
export function SaveInterpretationForm({ runId, settings }: { runId: number; settings: InterpretationSettings }) {
  const save = useSaveInterpretation(runId);
  const [method, setMethod] = useState<string>(settings.ultimateMethod ?? '');
  const [reason, setReason] = useState('');
  const [problems, setProblems] = useState<{ method?: string; reason?: string }>({});
  const serverField = isApiError(save.error) ? save.error.field : undefined;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const found = { method: method ? undefined : 'Choose the method you rely on.', reason: reason.trim() ? undefined : 'Say why you chose it.' };
    setProblems(found);
    if (found.method || found.reason) return;
    save.mutate({ options: settings, chosenMethod: method as UltimateChoice, reason: reason.trim() }, { onSuccess: () => setReason('') });
  };

  return (
    <form onSubmit={submit} aria-label="Save interpretation" className="flex flex-col gap-3">
      <SelectField
        label="Chosen ultimate method"
        options={METHOD_OPTIONS}
        placeholder="Choose…"
        value={method}
        onChange={(e) => setMethod(e.target.value)}
        error={problems.method ?? (serverField === 'chosenMethod' ? save.error?.message : undefined)}
      />
      <TextAreaField
        label="Reason"
        value={reason}
        maxLength={500}
        onChange={(e) => setReason(e.target.value)}
        error={problems.reason ?? (serverField === 'reason' ? save.error?.message : undefined)}
        hint="Recorded with the interpretation and in the audit trail."
      />
      <FormError message={save.error && !serverField ? save.error.message : undefined} />
      {save.isSuccess && <FormNotice>Saved as version {save.data.version}.</FormNotice>}
      <div>
        <Button type="submit" busy={save.isPending} busyLabel="Saving…">
          Save interpretation
        </Button>
      </div>
    </form>
  );
}
