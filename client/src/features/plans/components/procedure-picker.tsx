import { PROCEDURE_PROFILES, type ProcedureProfile } from '@shared/procedures/profiles';
import { SelectField } from '../../../components/form-field';
import { planFieldLabel } from '../utils/plan-fields';

const OPTIONS = PROCEDURE_PROFILES.map((p) => ({ value: p.id, label: p.name }));

interface ProcedurePickerProps {
  value: string;
  error?: string;
  onChoose: (procedureId: string) => void;
}

/** Chooses the procedure profile; choosing fills the plan with its defaults. */
export function ProcedurePicker({ value, error, onChoose }: ProcedurePickerProps) {
  const profile = PROCEDURE_PROFILES.find((p) => p.id === value);
  // A saved plan may name a procedure this version does not know; show it rather than a wrong one.
  const options = value && !profile ? [...OPTIONS, { value, label: `${value} (not a known procedure)` }] : OPTIONS;
  return (
    <div className="flex flex-col gap-3">
      <SelectField
        label="Procedure"
        placeholder="Choose a procedure…"
        options={options}
        value={value}
        error={error}
        hint="Choosing a procedure replaces the plate, pressures, hold, schedule and stop settings with its defaults."
        onChange={(e) => onChoose(e.target.value)}
      />
      {profile && <ProfileSummary profile={profile} />}
    </div>
  );
}

function ProfileSummary({ profile }: { profile: ProcedureProfile }) {
  const [minPlate, maxPlate] = profile.plateSizeRangeMm;
  return (
    <div className="rounded-md border-2 border-neutral-300 bg-neutral-50 p-3">
      <p>{profile.summary}</p>
      <dl className="mt-2 grid gap-x-4 gap-y-1 sm:grid-cols-[max-content_1fr]">
        <dt className="font-semibold">Defaults follow</dt>
        <dd>{profile.family === 'none' ? 'no standard' : `the ${profile.family} (not a claim of compliance)`}</dd>
        <dt className="font-semibold">Plate sizes</dt>
        <dd className="font-mono">
          {minPlate}–{maxPlate} mm
        </dd>
        <dt className="font-semibold">Pit width</dt>
        <dd>{profile.minPitWidthInPlates > 0 ? <span className="font-mono">≥ {profile.minPitWidthInPlates} plate widths</span> : 'not checked'}</dd>
        <dt className="font-semibold">Reaction margin</dt>
        <dd className="font-mono">+{Math.round(profile.reactionMargin * 100)} % over the largest load</dd>
      </dl>
      <details className="mt-2">
        <summary className="flex min-h-touch cursor-pointer items-center font-semibold underline underline-offset-4">
          Where the defaults come from ({profile.sources.length})
        </summary>
        <ul className="mt-2 flex flex-col gap-2">
          {profile.sources.map((s) => (
            <li key={`${s.setting}-${s.text}`}>
              <span className="font-semibold">{planFieldLabel(s.setting)}</span> <span className="rounded border border-neutral-600 px-1 text-sm">{s.tag}</span>
              <br />
              {s.text}
            </li>
          ))}
        </ul>
      </details>
    </div>
  );
}
