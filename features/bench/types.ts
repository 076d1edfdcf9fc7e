/** Bench records as they travel to the browser (ids as strings, dates as ISO strings, values in SI units). */
import type { ComparisonRow, RecordAnalysis } from '@/lib/bench/analyze';
import type { BenchConditions } from '@/features/bench/record-analysis';

export interface BenchRecordDto {
  id: string;
  revisionId: string;
  revisionLabel: string;
  fileName: string;
  format: 'edf' | 'csv';
  byteLength: number;
  sha256: string;
  channel: string;
  unit: 'V' | 'mV' | 'uV' | null;
  gainMode: 'referred-to-input' | 'gain-to-apply';
  gainVPerV: number;
  note: string;
  /** Measurements (no spectrum), the conditions and notes. */
  analysis: Omit<RecordAnalysis, 'spectrum'> & { conditions: BenchConditions; notes: string[] };
  comparison: ComparisonRow[];
  withdrawn: { at: string; byName: string | null; reason: string } | null;
  createdAt: string;
  createdByName: string;
}

/** A record with what its plots need, recomputed from the stored file. */
export interface BenchRecordDetailDto extends BenchRecordDto {
  trace: { tS: number[]; inputV: number[] };
  spectrum: { frequencyHz: number[]; asdVPerRtHz: number[] };
}

type SummaryRow = {
  id: number;
  revisionId: number;
  revisionLabel: string;
  fileName: string;
  format: 'edf' | 'csv';
  byteLength: number;
  sha256: string;
  channel: string;
  unit: 'V' | 'mV' | 'uV' | null;
  gainMode: 'referred-to-input' | 'gain-to-apply';
  gainVPerV: number;
  note: string;
  analysis: Record<string, unknown>;
  comparison: unknown[];
  withdrawnAt: Date | null;
  withdrawnByName: string | null;
  withdrawnReason: string | null;
  createdAt: Date;
  createdByName: string;
};

export function toBenchRecordDto(row: SummaryRow): BenchRecordDto {
  return {
    id: String(row.id),
    revisionId: String(row.revisionId),
    revisionLabel: row.revisionLabel,
    fileName: row.fileName,
    format: row.format,
    byteLength: row.byteLength,
    sha256: row.sha256,
    channel: row.channel,
    unit: row.unit,
    gainMode: row.gainMode,
    gainVPerV: row.gainVPerV,
    note: row.note,
    analysis: row.analysis as BenchRecordDto['analysis'],
    comparison: row.comparison as ComparisonRow[],
    withdrawn: row.withdrawnAt ? { at: row.withdrawnAt.toISOString(), byName: row.withdrawnByName, reason: row.withdrawnReason ?? '' } : null,
    createdAt: row.createdAt.toISOString(),
    createdByName: row.createdByName,
  };
}
