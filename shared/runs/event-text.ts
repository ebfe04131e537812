import { UNLOAD_REASON_LABELS, type UnloadReason } from '../plans/unloading';
import { formatPlanned, formatQuantity } from '../units/format';

const kPa = (v: number | null) => (v === null ? '—' : `${formatPlanned(v, 'kPa')} kPa`);

/** A run event as any view has it: its kind and what it carries. */
export interface EventLike {
  kind: string;
  payload: Record<string, unknown> | null;
}

/** Each alarm rule in words, for log lines that name an alarm only by its key ("signal-lost:g1"). */
const ALARM_WORDS: Record<string, string> = {
  'load-drift': 'load drifting off target',
  'plate-tilt': 'plate tilting',
  'gauge-travel': 'gauge near the end of its travel',
  'stop-limit': 'settlement near the stop limit',
  'reaction-capacity': 'reaction load nearly used',
  'signal-lost': 'signal lost',
  'calibration-overdue': 'calibration overdue',
  'readings-unsecured': 'readings not secured',
};

/** An alarm's key in words: "signal lost (g1)". */
export function alarmKeyWords(key: unknown): string {
  if (typeof key !== 'string' || key === '') return 'alarm';
  const [code, subject] = key.split(/:(.*)/s);
  const words = ALARM_WORDS[code] ?? code.replaceAll('-', ' ');
  return subject ? `${words} (${subject})` : words;
}

/** "Stage 3" for stage index 2: people count stages from 1, as the console does. */
export function stageNumber(index: unknown): string {
  return typeof index === 'number' && Number.isInteger(index) && index >= 0 ? `Stage ${index + 1}` : 'Stage';
}

const text = (v: unknown): string => (typeof v === 'string' ? v : '');
const num = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);
const capitalise = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** A kind no entry below knows, still in words: "pump-serviced" → "Pump serviced". */
function fallbackTitle(kind: string): string {
  return capitalise(kind.replaceAll(/[-_]/g, ' '));
}

/**
 * A run event as one line of plain words: a title ("Alarm raised") and a detail with every figure in its
 * unit's precision ("Load 7.1 kPa is 2.9 kPa below the 10.0 kPa target"). Never a raw code.
 */
export function describeRunEvent(event: EventLike): { title: string; detail: string } {
  const p = event.payload ?? {};
  switch (event.kind) {
    case 'run-created':
      return { title: 'Run set up', detail: text(p.rig) ? `on ${text(p.rig)}` : '' };
    case 'control-taken':
      return { title: 'Control taken', detail: text(p.from) ? `from ${text(p.from)}` : '' };
    case 'note':
      return { title: p.topic === 'weather' ? 'Weather' : 'Note', detail: text(p.text) };
    case 'alarm-raise':
      return { title: 'Alarm raised', detail: text(p.message) || alarmKeyWords(p.key) };
    case 'alarm-clear':
      return { title: 'Alarm cleared', detail: text(p.message) || alarmKeyWords(p.key) };
    case 'alarm-acknowledge':
      return { title: 'Alarm acknowledged', detail: capitalise(alarmKeyWords(p.key)) };
    case 'alarm-shelve': {
      const minutes = num(p.minutes);
      const what = capitalise(alarmKeyWords(p.key));
      return {
        title: 'Alarm shelved',
        detail: `${what}${minutes === null ? '' : ` for ${formatQuantity(minutes, 'min')}`}${text(p.reason) ? `: ${text(p.reason)}` : ''}`,
      };
    }
    case 'gauges-zeroed':
      return { title: 'Gauges zeroed', detail: '' };
    case 'run-started':
      return { title: 'Run started', detail: `${stageNumber(p.stageIndex)} (seating) to ${kPa(num(p.targetKpa))}` };
    case 'calibration-overridden':
      return {
        title: 'Overdue calibration accepted',
        detail: [Array.isArray(p.instruments) ? p.instruments.join(', ') : '', text(p.reason)].filter(Boolean).join(': '),
      };
    case 'target-reached':
      return {
        title: 'Target reached',
        detail: `${stageNumber(p.stageIndex)}${p.by === 'operator' ? ', confirmed by the operator' : ', from the pressure reading'}`,
      };
    case 'hold-met':
      return text(p.underDrift) ? { title: 'Hold met under drift', detail: `${stageNumber(p.stageIndex)}: ${text(p.underDrift)}` } : { title: 'Hold met', detail: stageNumber(p.stageIndex) };
    case 'stage-advanced':
      return {
        title: p.early ? 'Next stage applied early' : 'Next stage applied',
        detail: `${stageNumber(p.to)} to ${kPa(num(p.targetKpa))}${text(p.reason) ? `: ${text(p.reason)}` : ''}`,
      };
    case 'unloading-begun': {
      const why = UNLOAD_REASON_LABELS[p.reason as UnloadReason] ?? text(p.reason);
      const from = num(p.maxKpa) === null ? 'no loading stage reached' : `from ${kPa(num(p.maxKpa))} (${stageNumber(p.reachedIndex)})`;
      return { title: 'Unloading begun', detail: `${capitalise(why)}${text(p.note) ? ` — ${text(p.note)}` : ''}; ${from}` };
    }
    case 'top-up':
      return { title: 'Load topped up', detail: p.stageIndex === undefined ? '' : stageNumber(p.stageIndex) };
    case 'gauge-reset':
      return {
        title: 'Gauge reset',
        detail: `${text(p.channel) || 'gauge'}: ${formatQuantity(num(p.beforeMm), 'mm')} before, ${formatQuantity(num(p.afterMm), 'mm')} after`,
      };
    case 'manual-reading':
      return { title: 'Readings entered by hand', detail: num(p.pressureKpa) === null ? '' : `at ${formatQuantity(num(p.pressureKpa), 'kPa')}` };
    case 'run-completed':
      return { title: 'Run finished', detail: 'all stages done' };
    case 'run-stopped':
      return { title: 'Run stopped', detail: text(p.reason) };
    case 'outage': {
      const from = num(p.fromMs);
      const to = num(p.toMs);
      const gap = from !== null && to !== null ? `no samples for ${formatQuantity((to - from) / 60_000, 'min')}` : 'no samples in this gap';
      return { title: 'Recording interrupted', detail: gap };
    }
    case 'calibration-applied':
      return { title: 'Calibration applied', detail: text(p.instrument) || text(p.channel) };
    default:
      return { title: fallbackTitle(event.kind), detail: text(p.text) || text(p.reason) || text(p.message) };
  }
}

/** A run event as one line: "Alarm raised: Load 7.1 kPa is …", or the title alone when there is no detail. */
export function runEventLine(event: EventLike): string {
  const { title, detail } = describeRunEvent(event);
  return detail ? `${title}: ${detail}` : title;
}
