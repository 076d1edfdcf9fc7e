import { AppError, errorResponse } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { partsCsvTemplate } from '@/lib/parts/csv-import';
import { templateQuerySchema } from '@/app/api/parts/template/schema';

/** The CSV template of a part kind: the header of every field and one invented example row. */
export async function GET(request: Request) {
  try {
    const query = templateQuerySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
    if (!query.success) throw new AppError('invalid-input', query.error.issues.map((i) => i.message).join('; '));
    await requireSession();
    return new Response(partsCsvTemplate(query.data.kind), {
      headers: {
        'content-type': 'text/csv; charset=utf-8',
        'content-disposition': `attachment; filename="channelsmith-parts-${query.data.kind}.csv"`,
        'cache-control': 'no-store',
      },
    });
  } catch (error) {
    return errorResponse(error);
  }
}
