import { type DeviceProfile, type LabProfileInput, labProfileInput } from '@shared/devices/schema';
import type { z } from 'zod';
import { readableErrors } from '../../../lib/form-errors';

/**
 * The device profile form edits text boxes; this turns them into a profile for the shared schema and
 * back. Control characters of an ASCII request are typed as escapes ("?\r").
 */
export interface ProfileDraft {
  protocol: DeviceProfile['protocol'];
  id: string;
  name: string;
  baudRate: string;
  dataBits: string;
  parity: string;
  stopBits: string;
  pollIntervalMs: string;
  timeoutMs: string;
  scale: string;
  /** Modbus RTU */
  unitId: string;
  functionCode: string;
  register: string;
  format: string;
  wordOrder: string;
  byteOrder: string;
  offset: string;
  modbusUnit: string;
  /** ASCII */
  mode: string;
  request: string;
  terminator: string;
  pattern: string;
  asciiUnit: string;
  sign: string;
}

const ESCAPES: Record<string, string> = { r: '\r', n: '\n', t: '\t', '\\': '\\' };
const UNESCAPES: Record<string, string> = { '\r': '\\r', '\n': '\\n', '\t': '\\t', '\\': '\\\\' };

/** "?\\r" as typed → "?\r" as sent. */
export const decodeEscapes = (typed: string) => typed.replace(/\\([rnt\\])/g, (_, c: string) => ESCAPES[c]);
/** "?\r" as sent → "?\\r" to show in a text box. */
export const encodeEscapes = (sent: string) => sent.replace(/[\r\n\t\\]/g, (c) => UNESCAPES[c]);

/** A new profile: Modbus RTU, float32 high word first (the common convention), 9600 8N1. */
export function blankProfileDraft(): ProfileDraft {
  return {
    protocol: 'modbus-rtu',
    id: '',
    name: '',
    baudRate: '9600',
    dataBits: '8',
    parity: 'none',
    stopBits: '1',
    pollIntervalMs: '200',
    timeoutMs: '500',
    scale: '1',
    unitId: '1',
    functionCode: '3',
    register: '0',
    format: 'float32',
    wordOrder: 'high-first',
    byteOrder: 'big',
    offset: '0',
    modbusUnit: 'MPa',
    mode: 'polled',
    request: '',
    terminator: '\r\n',
    pattern: '',
    asciiUnit: 'mm',
    sign: '1',
  };
}

/** A saved profile as the form shows it; the fields of the other protocol keep their blank defaults. */
export function profileDraft(p: DeviceProfile): ProfileDraft {
  const common = {
    ...blankProfileDraft(),
    protocol: p.protocol,
    id: p.id,
    name: p.name,
    baudRate: String(p.serial.baudRate),
    dataBits: String(p.serial.dataBits),
    parity: p.serial.parity,
    stopBits: String(p.serial.stopBits),
    pollIntervalMs: String(p.pollIntervalMs),
    timeoutMs: String(p.timeoutMs),
    scale: String(p.scale),
  };
  if (p.protocol === 'ascii') {
    return {
      ...common,
      mode: p.mode,
      request: encodeEscapes(p.request),
      terminator: p.terminator,
      pattern: p.pattern,
      asciiUnit: p.unit,
      sign: String(p.sign),
    };
  }
  return {
    ...common,
    unitId: String(p.unitId),
    functionCode: String(p.functionCode),
    register: String(p.register),
    format: p.format,
    wordOrder: p.wordOrder,
    byteOrder: p.byteOrder,
    offset: String(p.offset),
    modbusUnit: p.unit,
  };
}

/** An empty box stays empty (the schema says "required"), never 0. */
const num = (text: string) => (text.trim() === '' ? undefined : Number(text));

/** The draft as the API takes it (not yet checked). */
export function draftToInput(d: ProfileDraft): Record<string, unknown> {
  const serial = { baudRate: num(d.baudRate), dataBits: num(d.dataBits), parity: d.parity, stopBits: num(d.stopBits) };
  const common = { id: d.id.trim(), name: d.name.trim(), serial, pollIntervalMs: num(d.pollIntervalMs), timeoutMs: num(d.timeoutMs), scale: num(d.scale) };
  if (d.protocol === 'ascii') {
    return {
      protocol: 'ascii',
      ...common,
      mode: d.mode,
      request: decodeEscapes(d.request),
      terminator: d.terminator,
      pattern: d.pattern,
      unit: d.asciiUnit,
      sign: num(d.sign),
    };
  }
  return {
    protocol: 'modbus-rtu',
    ...common,
    unitId: num(d.unitId),
    functionCode: num(d.functionCode),
    register: num(d.register),
    format: d.format,
    wordOrder: d.wordOrder,
    byteOrder: d.byteOrder,
    offset: num(d.offset),
    unit: d.modbusUnit,
  };
}

/** Schema paths → the draft's box for them (the two protocols name their unit alike). */
export function draftField(path: string, protocol: DeviceProfile['protocol']): keyof ProfileDraft | null {
  if (path === 'unit') return protocol === 'ascii' ? 'asciiUnit' : 'modbusUnit';
  const name = path.startsWith('serial.') ? path.slice('serial.'.length) : path;
  return name in blankProfileDraft() ? (name as keyof ProfileDraft) : null;
}

export type DraftCheck = { ok: true; input: LabProfileInput } | { ok: false; errors: Partial<Record<keyof ProfileDraft, string>>; other: string[] };

/** Checks the draft with the server's own schema: errors by box, and any that has no box. */
export function checkDraft(d: ProfileDraft): DraftCheck {
  const parsed = labProfileInput.safeParse(draftToInput(d), readableErrors);
  if (parsed.success) return { ok: true, input: parsed.data };
  return { ok: false, ...placeIssues(parsed.error, d.protocol) };
}

function placeIssues(error: z.ZodError, protocol: DeviceProfile['protocol']) {
  const errors: Partial<Record<keyof ProfileDraft, string>> = {};
  const other: string[] = [];
  for (const issue of error.issues) {
    const path = issue.path.join('.');
    const field = draftField(path, protocol);
    if (field) errors[field] ??= issue.message;
    else other.push(`${path}: ${issue.message}`);
  }
  return { errors, other };
}
