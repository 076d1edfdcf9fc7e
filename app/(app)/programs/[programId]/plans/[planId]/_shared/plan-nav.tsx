import Link from 'next/link';

/** Breadcrumb and the plan's sub-navigation (workspace, revisions, compare, history, bench records). */
export function PlanNav({
  programId,
  planId,
  programName,
  planName,
  current,
  showWorkspace,
}: {
  programId: number;
  planId: number;
  programName: string;
  planName: string;
  current: string;
  showWorkspace: boolean;
}) {
  const base = `/programs/${programId}/plans/${planId}`;
  return (
    <div className="space-y-2">
      <nav aria-label="Breadcrumb" className="text-sm text-ink-soft">
        {showWorkspace ? (
          <>
            <Link href="/programs" className="underline-offset-2 hover:underline">
              Programs
            </Link>{' '}
            /{' '}
            <Link href={`/programs/${programId}`} className="underline-offset-2 hover:underline">
              {programName}
            </Link>{' '}
            /{' '}
            <Link href={base} className="underline-offset-2 hover:underline">
              {planName}
            </Link>{' '}
          </>
        ) : (
          <>
            <Link href="/released" className="underline-offset-2 hover:underline">
              Released revisions
            </Link>{' '}
            / {programName} / {planName}{' '}
          </>
        )}
        / <span aria-current="page">{current}</span>
      </nav>
      <nav aria-label="Plan sections" className="flex gap-4 text-sm">
        {showWorkspace ? (
          <Link href={base} className="text-copper-dark underline-offset-2 hover:underline">
            Workspace
          </Link>
        ) : null}
        <Link href={`${base}/revisions`} className="text-copper-dark underline-offset-2 hover:underline">
          Revisions
        </Link>
        <Link href={`${base}/revisions/compare`} className="text-copper-dark underline-offset-2 hover:underline">
          Compare
        </Link>
        <Link href={`${base}/history`} className="text-copper-dark underline-offset-2 hover:underline">
          History
        </Link>
        <Link href={`${base}/bench`} className="text-copper-dark underline-offset-2 hover:underline">
          Bench records
        </Link>
      </nav>
    </div>
  );
}
