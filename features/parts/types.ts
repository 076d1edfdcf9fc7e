/** Part-library data as it travels to the browser (ids as strings, dates as ISO strings). */
import type { PartKind, PartStatus } from '@/lib/parts/part-kinds';

export interface LibraryPartDto {
  id: string;
  kind: PartKind;
  name: string;
  description: string;
  status: PartStatus;
  sourceNote: string;
  /** Parameters keyed by field name, SI units (electrode type as text). */
  values: Record<string, number | string>;
  retiredAt: string | null;
  createdAt: string;
  updatedAt: string;
  updatedByName: string;
}

type LibraryPartRow = Omit<LibraryPartDto, 'id' | 'retiredAt' | 'createdAt' | 'updatedAt'> & {
  id: number;
  retiredAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
};

export function toLibraryPartDto(row: LibraryPartRow): LibraryPartDto {
  return {
    id: String(row.id),
    kind: row.kind,
    name: row.name,
    description: row.description,
    status: row.status,
    sourceNote: row.sourceNote,
    values: row.values,
    retiredAt: row.retiredAt ? row.retiredAt.toISOString() : null,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    updatedByName: row.updatedByName,
  };
}

/** One problem of an import file, as the preview lists it. */
export interface ImportProblemDto {
  /** Spreadsheet row (header = 1); 0 for the whole file. */
  row: number;
  column: string;
  field: string;
  value: string;
  message: string;
}

/** The answer to an import preview or a refused import. */
export interface ImportPreviewDto {
  kind: PartKind;
  fileName: string;
  /** The file's header cells. */
  header: string[];
  /** The mapping used (column → field or null), to prefill the mapping form. */
  mapping: Record<string, string | null>;
  /** Where the mapping came from. */
  mappingSource: 'given' | 'remembered' | 'suggested';
  /** True when the whole file was refused (nothing can be imported until it is fixed). */
  refused: boolean;
  validCount: number;
  /** Every bad row and cell. */
  problems: ImportProblemDto[];
  /** The first valid parts, for a look before importing (at most 20). */
  sample: Array<{ row: number; name: string; values: Record<string, number | string> }>;
}

export interface ImportResultDto {
  kind: PartKind;
  imported: number;
  ids: string[];
}
