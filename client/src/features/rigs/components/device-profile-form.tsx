import type { ListedDeviceProfile } from '@shared/devices/schema';
import { type FormEvent, useState } from 'react';
import { FormActions } from '../../../components/button';
import { FormError } from '../../../components/form-alert';
import { NumberField, SelectField, TextField } from '../../../components/form-field';
import { isApiError } from '../../../lib/api-client';
import { useSaveDeviceProfile } from '../api/save-device-profile';
import { ProfilePreviewPanel } from './profile-preview';
import { blankProfileDraft, checkDraft, draftField, type ProfileDraft, profileDraft } from '../utils/profile-draft';

const options = (pairs: [string, string][]) => pairs.map(([value, label]) => ({ value, label }));

const PROTOCOLS = options([
  ['modbus-rtu', 'Modbus RTU (transducer, ADC, load cell)'],
  ['ascii', 'ASCII lines (displacement indicator)'],
]);
const PARITIES = options([
  ['none', 'None'],
  ['even', 'Even'],
  ['odd', 'Odd'],
]);
const DATA_BITS = options([
  ['8', '8'],
  ['7', '7'],
]);
const STOP_BITS = options([
  ['1', '1'],
  ['2', '2'],
]);
const FUNCTIONS = options([
  ['3', '03 Read holding registers'],
  ['4', '04 Read input registers'],
]);
const FORMATS = options([
  ['int16', 'int16 (one register, signed)'],
  ['uint16', 'uint16 (one register)'],
  ['int32', 'int32 (two registers, signed)'],
  ['uint32', 'uint32 (two registers)'],
  ['float32', 'float32 (two registers, IEEE 754)'],
]);
const WORD_ORDERS = options([
  ['high-first', 'High word first (big-endian, the common convention)'],
  ['low-first', 'Low word first'],
]);
const BYTE_ORDERS = options([
  ['big', 'High byte first (as Modbus sends it)'],
  ['swapped', 'Bytes swapped in each register'],
]);
const MODBUS_UNITS = options([
  ['MPa', 'MPa'],
  ['bar', 'bar'],
  ['kPa', 'kPa'],
  ['kN', 'kN'],
]);
const MODES = options([
  ['polled', 'Polled: answers a request'],
  ['streaming', 'Free-running: sends on its own'],
]);
const TERMINATORS = options([
  ['\r\n', 'CR LF'],
  ['\r', 'CR'],
  ['\n', 'LF'],
]);
const ASCII_UNITS = options([
  ['mm', 'mm'],
  ['in', 'inch'],
  ['um', 'µm'],
  ['counts', 'counts (scale gives mm per count)'],
]);
const SIGNS = options([
  ['1', 'As printed'],
  ['-1', 'Reversed (the number falls as the stem goes in)'],
]);

type Errors = Partial<Record<keyof ProfileDraft, string>>;

interface DeviceProfileFormProps {
  /** The lab profile to change; omit to define a new one. */
  profile?: ListedDeviceProfile;
  onSaved: (profile: ListedDeviceProfile) => void;
  onCancel?: () => void;
}

/**
 * A device profile of the lab: protocol, serial settings, and for Modbus the slave id, function, register,
 * data type, word and byte order, scale and offset; checked with the server's own schema before sending.
 */
export function DeviceProfileForm({ profile, onSaved, onCancel }: DeviceProfileFormProps) {
  const save = useSaveDeviceProfile(profile?.id);
  const [draft, setDraft] = useState<ProfileDraft>(() => (profile ? profileDraft(profile) : blankProfileDraft()));
  const [errors, setErrors] = useState<Errors>({});
  const [formError, setFormError] = useState<string | undefined>();
  const modbus = draft.protocol === 'modbus-rtu';

  const box = (name: keyof ProfileDraft) => ({
    name,
    value: draft[name],
    error: errors[name],
    onChange: (e: { target: { value: string } }) => setDraft((d) => ({ ...d, [name]: e.target.value })),
  });

  const onSubmit = async (e: FormEvent) => {
    e.preventDefault();
    setFormError(undefined);
    const check = checkDraft(draft);
    if (!check.ok) {
      setErrors(check.errors);
      setFormError(check.other.length ? check.other.join('; ') : 'Some boxes need attention.');
      return;
    }
    setErrors({});
    try {
      onSaved(await save.mutateAsync(check.input));
    } catch (error) {
      const field = isApiError(error) && error.field ? draftField(error.field, draft.protocol) : null;
      const message = error instanceof Error ? error.message : 'The request failed.';
      if (field) setErrors({ [field]: message.replace(/^[\w.]+: /, '') });
      else setFormError(message);
    }
  };

  /** The profile as the boxes hold it now, for trying on a port (an id is not needed for that). */
  const current = () => {
    const check = checkDraft({ ...draft, id: draft.id.trim() || 'preview' });
    if (check.ok) return { profile: check.input };
    setErrors(check.errors);
    return { problem: 'Correct the boxes marked first.' };
  };

  return (
    <form onSubmit={onSubmit} noValidate className="flex max-w-4xl flex-col gap-5">
      <FormError message={formError} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Profile id" hint="What rig channels name; it cannot change later." mono disabled={profile !== undefined} {...box('id')} />
        <TextField label="Name" {...box('name')} />
        <SelectField label="Protocol" options={PROTOCOLS} {...box('protocol')} />
      </div>
      <fieldset className="grid gap-4 rounded-md border-2 border-neutral-300 p-4 sm:grid-cols-4">
        <legend className="px-1 font-semibold">Serial line</legend>
        <NumberField label="Baud rate" {...box('baudRate')} />
        <SelectField label="Data bits" options={DATA_BITS} {...box('dataBits')} />
        <SelectField label="Parity" options={PARITIES} {...box('parity')} />
        <SelectField label="Stop bits" options={STOP_BITS} {...box('stopBits')} />
      </fieldset>
      {modbus ? (
        <fieldset className="grid gap-4 rounded-md border-2 border-neutral-300 p-4 sm:grid-cols-3">
          <legend className="px-1 font-semibold">Modbus register</legend>
          <NumberField label="Slave id" hint="1–247" {...box('unitId')} />
          <SelectField label="Function" options={FUNCTIONS} {...box('functionCode')} />
          <NumberField label="Register" hint="Protocol address, from 0" {...box('register')} />
          <SelectField label="Data type" options={FORMATS} {...box('format')} />
          <SelectField label="Word order" hint="For 32-bit types: which register holds the high half." options={WORD_ORDERS} {...box('wordOrder')} />
          <SelectField label="Byte order" options={BYTE_ORDERS} {...box('byteOrder')} />
          <NumberField label="Scale" hint="value = raw × scale + offset" {...box('scale')} />
          <NumberField label="Offset" {...box('offset')} />
          <SelectField label="Unit" options={MODBUS_UNITS} {...box('modbusUnit')} />
        </fieldset>
      ) : (
        <fieldset className="grid gap-4 rounded-md border-2 border-neutral-300 p-4 sm:grid-cols-3">
          <legend className="px-1 font-semibold">ASCII lines</legend>
          <SelectField label="Mode" options={MODES} {...box('mode')} />
          <TextField label="Request" hint="Sent for each poll; write control characters as \r, \n, \t." mono {...box('request')} />
          <SelectField label="Line end" options={TERMINATORS} {...box('terminator')} />
          <TextField
            label="Pattern"
            hint="A regular expression over the whole line, with a group (?<value>…)."
            mono
            className="sm:col-span-3"
            {...box('pattern')}
          />
          <SelectField label="Unit printed" options={ASCII_UNITS} {...box('asciiUnit')} />
          <NumberField label="Scale" {...box('scale')} />
          <SelectField label="Sign" options={SIGNS} {...box('sign')} />
        </fieldset>
      )}
      <div className="grid gap-4 sm:grid-cols-2">
        <NumberField label="Poll interval" unit="ms" {...box('pollIntervalMs')} />
        <NumberField label="Timeout" unit="ms" {...box('timeoutMs')} />
      </div>
      <ProfilePreviewPanel current={current} />
      <FormActions submitLabel={profile ? 'Save profile' : 'Define profile'} busy={save.isPending} onCancel={onCancel} />
    </form>
  );
}
