import type { RecordFooting, TestRecord } from '../records/schema';
import type { InterpretationSettings } from '../schemas/interpretation';
import type { AnalyzeRecordOptions } from './analyze-record';
import { InterpretationInputError } from './input-checks';

/** The record's footing with the engineer's overrides, or none; a new footing needs a width and a soil behaviour. */
function footingWith(record: TestRecord, o: InterpretationSettings): RecordFooting | undefined {
  const overrides: Partial<RecordFooting> = {
    ...(o.footingShape ? { shape: o.footingShape } : {}),
    ...(o.footingWidthM !== undefined ? { widthM: o.footingWidthM } : {}),
    ...(o.footingLengthM !== undefined ? { lengthM: o.footingLengthM } : {}),
    ...(o.soilBehaviour ? { soilBehaviour: o.soilBehaviour } : {}),
    ...(o.permissibleSettlementMm !== undefined ? { permissibleSettlementMm: o.permissibleSettlementMm } : {}),
    ...(o.factorOfSafety !== undefined ? { factorOfSafety: o.factorOfSafety } : {}),
    ...(o.foundationDepthM !== undefined ? { foundationDepthM: o.foundationDepthM } : {}),
    ...(o.unitWeightKnM3 !== undefined ? { unitWeightKnM3: o.unitWeightKnM3 } : {}),
  };
  if (record.footing) return { ...record.footing, ...overrides };
  if (Object.keys(overrides).length === 0) return undefined;
  if (o.footingWidthM === undefined) throw new InterpretationInputError('footingWidthM', 'required, as the record names no footing');
  if (!o.soilBehaviour) throw new InterpretationInputError('soilBehaviour', 'required, as the record names no footing');
  return { shape: 'square', ...overrides, widthM: o.footingWidthM, soilBehaviour: o.soilBehaviour };
}

/** The record as the engineer wants it read, and the analysis options, from the settings (page, saved version, command line). */
export function applyDesignInputs(record: TestRecord, o: InterpretationSettings): { record: TestRecord; options: AnalyzeRecordOptions } {
  const footing = footingWith(record, o);
  if (o.settlementScaling === 'bond' && o.bondExponent === undefined) throw new InterpretationInputError('bondExponent', 'required with Bond’s rule (0.03 for clay to 0.5 for dense sand)');
  const scaling: AnalyzeRecordOptions['scaling'] =
    o.settlementScaling === undefined ? undefined : o.settlementScaling === 'bond' ? { kind: 'bond', exponentN: o.bondExponent as number } : { kind: o.settlementScaling };
  return {
    record: { ...record, footing },
    options: {
      ...(scaling ? { scaling } : {}),
      ...(o.ultimateMethod ? { ultimateMethod: o.ultimateMethod } : {}),
      ...(o.evConvention ? { evConvention: o.evConvention } : {}),
      ...(o.columnLoadKn !== undefined ? { columnLoadKn: o.columnLoadKn } : {}),
      ...(o.kApplication !== undefined ? { kApplication: o.kApplication } : {}),
      ...(o.unsoakedDeformationMm !== undefined && o.soakedDeformationMm !== undefined
        ? { soakedSpecimens: { unsoakedMm: o.unsoakedDeformationMm, soakedMm: o.soakedDeformationMm } }
        : {}),
      ...(o.evRequiredMnM2 !== undefined
        ? {
            evRequirement: {
              name: 'the contract’s requirement as entered',
              minEv2MnM2: o.evRequiredMnM2,
              ...(o.evMaxRatio !== undefined ? { maxRatio: o.evMaxRatio } : {}),
              ...(o.evRelaxFraction !== undefined ? { relaxWhenEv1AtLeastFractionOfRequiredEv2: o.evRelaxFraction } : {}),
            },
          }
        : {}),
    },
  };
}
