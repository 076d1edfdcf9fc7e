/** Programs as they travel to the browser (dates as ISO strings). */
export interface ProgramDto {
  id: string;
  name: string;
  description: string;
  archivedAt: string | null;
  createdAt: string;
  updatedAt: string;
  updatedByName: string;
  planCount: number;
}

/** The row from db/queries/programs as JSON. */
export function toProgramDto(row: {
  id: number;
  name: string;
  description: string;
  archivedAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
  updatedByName: string;
  planCount: number;
}): ProgramDto {
  return {
    id: String(row.id),
    name: row.name,
    description: row.description,
    archivedAt: row.archivedAt ? row.archivedAt.toISOString() : null,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    updatedByName: row.updatedByName,
    planCount: row.planCount,
  };
}
