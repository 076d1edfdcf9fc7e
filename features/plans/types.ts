/** Channel plans as they travel to the browser (dates as ISO strings, ids as strings). */
import type { Verdict } from '@/lib/engine/report';

export type PlanState = 'draft' | 'in-review' | 'released' | 'changes-requested' | 'superseded';

export interface PlanSummaryDto {
  id: string;
  programId: string;
  name: string;
  profileId: string;
  application: string;
  worstVerdict: Verdict | null;
  version: number;
  /** Label of the newest revision (A, B, …), null before the first freeze ("—" in tables). */
  revision: string | null;
  /** State of the newest revision, or 'draft' when the plan has never been frozen. */
  state: PlanState;
  archivedAt: string | null;
  createdAt: string;
  updatedAt: string;
  updatedByName: string;
}

export interface PlanDetailDto extends PlanSummaryDto {
  programName: string;
  programArchived: boolean;
  plan: Record<string, unknown>;
  report: unknown;
}

/** A library part as plan forms use it (the editor's `PartOption`). */
export interface PartOptionDto {
  id: string;
  kind: 'instrumentation-amplifier' | 'operational-amplifier' | 'converter' | 'electrode';
  name: string;
  status: string;
  sourceNote: string;
  description: string;
  values: Record<string, number>;
}

type SummaryRow = {
  id: number;
  programId: number;
  name: string;
  profileId: string;
  application: string;
  worstVerdict: Verdict | null;
  version: number;
  archivedAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
  updatedByName: string;
  latestRevision?: { label: string; state: PlanState } | null;
};

export function toPlanSummaryDto(row: SummaryRow): PlanSummaryDto {
  return {
    id: String(row.id),
    programId: String(row.programId),
    name: row.name,
    profileId: row.profileId,
    application: row.application,
    worstVerdict: row.worstVerdict,
    version: row.version,
    revision: row.latestRevision?.label ?? null,
    state: row.latestRevision?.state ?? 'draft',
    archivedAt: row.archivedAt ? row.archivedAt.toISOString() : null,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    updatedByName: row.updatedByName,
  };
}

export function toPlanDetailDto(
  row: SummaryRow & { programName: string; programArchivedAt: Date | null; plan: Record<string, unknown>; report: unknown },
): PlanDetailDto {
  return {
    ...toPlanSummaryDto(row),
    programName: row.programName,
    programArchived: row.programArchivedAt !== null,
    plan: row.plan,
    report: row.report,
  };
}

/** Numeric values only (text values such as an electrode type stay out of the form fill). */
export function toPartOptionDto(row: {
  id: number;
  kind: PartOptionDto['kind'];
  name: string;
  status: string;
  sourceNote: string;
  description: string;
  values: Record<string, number | string>;
}): PartOptionDto {
  const values: Record<string, number> = {};
  for (const [key, value] of Object.entries(row.values)) if (typeof value === 'number') values[key] = value;
  return {
    id: String(row.id),
    kind: row.kind,
    name: row.name,
    status: row.status,
    sourceNote: row.sourceNote,
    description: row.description,
    values,
  };
}
