import type { Rig } from '@shared/schemas/instruments';
import type { RunView } from '@shared/schemas/runs';
import { useState } from 'react';
import { Button } from '../../../components/button';
import { FormError } from '../../../components/form-alert';
import { SelectField } from '../../../components/form-field';
import { useCreateRun } from '../api/create-run';

interface RunSetupFormProps {
  /** The chosen plan; null until one is picked. */
  planId: number | null;
  rigs: Rig[];
  onCreated: (view: RunView) => void;
}

/** Picks the rig for the chosen plan and sets the run up on the server (which checks the rig is free). */
export function RunSetupForm({ planId, rigs, onCreated }: RunSetupFormProps) {
  const [rigId, setRigId] = useState('');
  const create = useCreateRun();
  const fieldError = create.error && 'field' in create.error && create.error.field === 'rigId' ? create.error.message : undefined;
  return (
    <form
      aria-label="Set up the run"
      className="flex max-w-xl flex-col gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        if (planId !== null && rigId) create.mutate({ planId, rigId: Number(rigId) }, { onSuccess: onCreated });
      }}
    >
      <SelectField
        label="Rig"
        placeholder="Choose the rig at the pit"
        value={rigId}
        onChange={(e) => setRigId(e.target.value)}
        options={rigs.map((r) => ({ value: String(r.id), label: `${r.name}${r.mode === 'manual' ? ' (readings by hand)' : ''}` }))}
        error={fieldError}
        required
      />
      <FormError message={create.error && !fieldError ? create.error.message : undefined} />
      <Button type="submit" className="self-start" busy={create.isPending} busyLabel="Setting up…" disabled={planId === null || !rigId}>
        Set up the run
      </Button>
    </form>
  );
}
