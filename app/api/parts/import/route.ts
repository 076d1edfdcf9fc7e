import { NextResponse } from 'next/server';
import { getImportMapping } from '@/db/queries/import-mappings';
import { importParts } from '@/db/queries/parts-import';
import { DuplicatePartNameError, listPartNames } from '@/db/queries/parts';
import { AppError, errorResponse } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { checkImport, csvHeader, decodeImportFile, initialMapping } from '@/features/parts/import-file';
import type { ImportResultDto } from '@/features/parts/types';
import { canEditParts } from '@/lib/auth/permissions';
import { partsCsvLimits } from '@/lib/parts/csv-import';
import { formFields, readUploadForm, zodError } from '@/app/api/parts/_shared/http';
import { importFormSchema } from '@/app/api/parts/import/schema';

/**
 * Part-library CSV import (multipart: file, kind, mode, optional mapping).
 * mode=preview validates and lists every bad row and cell; mode=import does the same and, only when
 * nothing is wrong, writes every part, the mapping and the audit event in one transaction.
 * Either way a file with problems answers 422 with the full list, and nothing is written.
 */
export async function POST(request: Request) {
  try {
    // Who may import is checked before the body is read, so a refused caller uploads nothing.
    const member = await requireSession();
    if (!canEditParts(member)) throw new AppError('forbidden', 'Only engineers and admins can import parts.');
    const { form, file, bytes } = await readUploadForm(request, { maxBytes: partsCsvLimits.maxBytes, limitText: '2 MB' });
    const fields = importFormSchema.safeParse(formFields(form));
    if (!fields.success) throw zodError(fields.error);
    const { kind, mode, mapping: givenMapping } = fields.data;
    const fileName = (file.name || 'parts.csv').slice(0, 255);

    const decoded = decodeImportFile(bytes);
    if (!decoded.ok) {
      throw new AppError('invalid-input', `file: ${decoded.message}; nothing was imported`, { file: [decoded.message] });
    }
    let mapping = givenMapping;
    let mappingSource: 'given' | 'remembered' | 'suggested' = 'given';
    if (!mapping) {
      const initial = initialMapping(csvHeader(decoded.text), kind, await getImportMapping({ workspaceId: member.workspaceId, kind }));
      mapping = initial.mapping;
      mappingSource = initial.source;
    }
    const existingNames = await listPartNames({ workspaceId: member.workspaceId, kind });
    const { preview, parts } = checkImport({ text: decoded.text, fileName, kind, mapping, mappingSource, existingNames });
    const hasProblems = preview.refused || preview.problems.length > 0;

    if (mode === 'preview') return NextResponse.json({ preview }, { status: 200 });
    if (hasProblems) {
      const count = preview.problems.length;
      return NextResponse.json(
        {
          error: {
            code: 'invalid-input',
            message: preview.refused
              ? `The file was refused: ${preview.problems.map((p) => p.message).join('; ')}. Nothing was imported.`
              : `${count} problem${count === 1 ? '' : 's'} in the file; nothing was imported. Fix every listed row and try again.`,
          },
          preview,
        },
        { status: 422 },
      );
    }
    if (parts.length === 0) throw new AppError('invalid-input', 'file: the file has no data rows; nothing was imported', { file: ['no data rows'] });

    let ids: number[];
    try {
      ({ ids } = await importParts({
        workspaceId: member.workspaceId,
        userId: member.userId,
        kind,
        rows: parts,
        mapping,
        fileName,
        fileSha256: decoded.sha256,
      }));
    } catch (error) {
      if (error instanceof DuplicatePartNameError) throw new AppError('conflict', `${error.message} Nothing was imported.`);
      if ((error as { cause?: { code?: string } })?.cause?.code === 'ER_DUP_ENTRY') {
        throw new AppError('conflict', 'A part of the same name was added meanwhile; nothing was imported. Check the file again.');
      }
      throw error;
    }
    const body: ImportResultDto = { kind, imported: ids.length, ids: ids.map(String) };
    return NextResponse.json(body, { status: 201 });
  } catch (error) {
    return errorResponse(error);
  }
}
