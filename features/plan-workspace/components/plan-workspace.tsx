'use client';
/**
 * The channel-plan workspace: the chain as a row of stages, the open stage's form, live results
 * computed in the browser as the user types, the save flow with optimistic concurrency, and the
 * result views.
 */
import { useCallback, useContext, useEffect, useMemo, useRef, useState } from 'react';
import { QueryClient, QueryClientContext, QueryClientProvider } from '@tanstack/react-query';
import type { ChannelPlan } from '@/lib/engine/plan';
import { ChainRow } from '@/features/plan-workspace/components/chain-row';
import { StageForm, StageValues } from '@/features/plan-workspace/components/stage-form';
import { ResultViews } from '@/features/plan-workspace/components/result-views';
import { SaveBar, ConflictPanel, type SaveStatus } from '@/features/plan-workspace/components/save-bar';
import { useLiveReport } from '@/features/plan-workspace/hooks/use-live-report';
import { useSavePlan, type SavePlanStale } from '@/features/plan-workspace/api/save-plan';
import { applyFieldEdit, applyPart, plansEqual, type PartOption, type PlanDraft } from '@/features/plan-workspace/plan-edit';
import { fieldKey, findField, stageOfPath, stages, type StageId } from '@/features/plan-workspace/stage-fields';
import { patchPath } from '@/features/plan-workspace/report-view';
import { formatDurationMs } from '@/features/plan-workspace/format';

export type { PartOption } from '@/features/plan-workspace/plan-edit';

export interface PlanWorkspaceProps {
  planId: string;
  programId: string;
  initialPlan: ChannelPlan;
  initialVersion: number;
  canEdit: boolean;
  parts: PartOption[];
  planName: string;
}

/**
 * The workspace. Uses the app's react-query client when there is one, else its own.
 */
export function PlanWorkspace(props: PlanWorkspaceProps) {
  const existing = useContext(QueryClientContext);
  const [ownClient] = useState(() => (existing ? null : new QueryClient({ defaultOptions: { queries: { staleTime: 30_000 } } })));
  if (ownClient) {
    return (
      <QueryClientProvider client={ownClient}>
        <Workspace {...props} />
      </QueryClientProvider>
    );
  }
  return <Workspace {...props} />;
}

function toDraft(plan: unknown): PlanDraft {
  return JSON.parse(JSON.stringify(plan)) as PlanDraft;
}

function Workspace({ planId, initialPlan, initialVersion, canEdit, parts, planName }: PlanWorkspaceProps) {
  const [draft, setDraft] = useState<PlanDraft>(() => toDraft(initialPlan));
  const [baseline, setBaseline] = useState<PlanDraft>(() => toDraft(initialPlan));
  const [version, setVersion] = useState(initialVersion);
  const [openStage, setOpenStage] = useState<StageId | null>(null);
  const [formEpoch, setFormEpoch] = useState(0);
  const [invalidKeys, setInvalidKeys] = useState<Record<string, StageId>>({});
  const [serverIssues, setServerIssues] = useState<Record<string, string>>({});
  const [status, setStatus] = useState<SaveStatus>({ kind: 'idle' });
  const [conflict, setConflict] = useState<SavePlanStale['current'] | null>(null);
  const typed = useRef<Record<string, string | boolean>>({});
  const draftRef = useRef(draft);
  draftRef.current = draft;

  const live = useLiveReport(draft);
  const save = useSavePlan(planId);

  const hasInvalidText = Object.keys(invalidKeys).length > 0;
  const dirty = hasInvalidText || !plansEqual(draft, baseline);

  // Warn before leaving with unsaved changes.
  useEffect(() => {
    if (!dirty) return;
    const onBeforeUnload = (event: BeforeUnloadEvent) => {
      event.preventDefault();
      event.returnValue = '';
    };
    // Links inside the app navigate without unloading the page: ask before following one.
    const onClickCapture = (event: MouseEvent) => {
      if (event.defaultPrevented || event.button !== 0 || event.metaKey || event.ctrlKey || event.shiftKey || event.altKey) return;
      const anchor = (event.target as Element | null)?.closest?.('a[href]');
      if (!(anchor instanceof HTMLAnchorElement) || anchor.target === '_blank' || anchor.hasAttribute('download')) return;
      const url = new URL(anchor.href, window.location.href);
      if (url.origin !== window.location.origin || (url.pathname === window.location.pathname && url.search === window.location.search)) return;
      if (!window.confirm('This plan has unsaved changes. Leave the page and lose them?')) {
        event.preventDefault();
        event.stopPropagation();
      }
    };
    window.addEventListener('beforeunload', onBeforeUnload);
    document.addEventListener('click', onClickCapture, true);
    return () => {
      window.removeEventListener('beforeunload', onBeforeUnload);
      document.removeEventListener('click', onClickCapture, true);
    };
  }, [dirty]);

  /** Issues by dotted path: the server's (422) and the live validation's. */
  const issues = useMemo(() => {
    const out: Record<string, string> = { ...serverIssues };
    for (const i of live.issues) if (!(i.path in out)) out[i.path] = i.message;
    return out;
  }, [serverIssues, live.issues]);

  const invalidStages = useMemo(() => {
    const set = new Set<StageId>(Object.values(invalidKeys));
    for (const path of Object.keys(issues)) set.add(stageOfPath(path.split('.')));
    return set;
  }, [invalidKeys, issues]);

  const onEdit = useCallback((path: string[], value: unknown) => {
    const next = applyFieldEdit(draftRef.current, path, value);
    draftRef.current = next;
    setDraft(next);
    const dotted = path.join('.');
    setServerIssues((prev) => {
      if (!(dotted in prev)) return prev;
      const copy = { ...prev };
      delete copy[dotted];
      return copy;
    });
    return next;
  }, []);

  const onTyped = useCallback((key: string, text: string | boolean, valid: boolean) => {
    typed.current[key] = text;
    setInvalidKeys((prev) => {
      if (valid === !(key in prev)) return prev;
      const copy = { ...prev };
      if (valid) delete copy[key];
      else {
        const found = findField(key.split('_'));
        copy[key] = found?.stageId ?? 'profile';
      }
      return copy;
    });
  }, []);

  /** Replaces the draft from outside the form (part, suggestion, reload): typed text of the changed fields is dropped. */
  const replaceDraft = useCallback((next: PlanDraft, changedPaths: string[][] | 'all') => {
    if (changedPaths === 'all') {
      typed.current = {};
      setInvalidKeys({});
    } else {
      const keys = changedPaths.map((p) => fieldKey(p));
      for (const k of keys) delete typed.current[k];
      setInvalidKeys((prev) => {
        const copy = { ...prev };
        for (const k of keys) delete copy[k];
        return copy;
      });
    }
    draftRef.current = next;
    setDraft(next);
    setFormEpoch((e) => e + 1);
  }, []);

  const onChoosePart = useCallback(
    (stageId: StageId, part: PartOption) => {
      const { plan, changed } = applyPart(draftRef.current, stageId, part);
      replaceDraft(plan, changed);
      const maxRateHz = part.values.sampleRateMaxHz;
      const rateHz = draftRef.current.adc && typeof (draftRef.current.adc as Record<string, unknown>).sampleRateHz === 'number' ? ((draftRef.current.adc as Record<string, unknown>).sampleRateHz as number) : undefined;
      const rateNote = part.kind === 'converter' && maxRateHz !== undefined && rateHz !== undefined && rateHz > maxRateHz ? ` Note: the plan's sample rate is above this converter's maximum (${maxRateHz} Hz).` : '';
      setStatus({ kind: 'info', message: `Filled ${stages[stageId].noun} from “${part.name}” (${changed.length} values changed; not saved yet).${rateNote}` });
    },
    [replaceDraft],
  );

  const onApplySuggestion = useCallback(
    (path: string, value: number, title: string) => {
      const p = patchPath(path);
      // An ordinary edit: a suggested Rg replaces a target gain and the other way round.
      const next = applyFieldEdit(draftRef.current, p, value);
      replaceDraft(next, [p, ['instrumentation', 'rgOhm'], ['instrumentation', 'targetGain']]);
      setStatus({ kind: 'info', message: `Applied: ${title}. Not saved yet.` });
      setOpenStage(stageOfPath(p));
    },
    [replaceDraft],
  );

  const onSave = useCallback(() => {
    if (hasInvalidText) {
      setStatus({ kind: 'error', message: 'Some fields hold values that cannot be read; fix the fields marked in red first. Nothing was saved.' });
      return;
    }
    const sent = draftRef.current;
    setStatus({ kind: 'saving' });
    save.mutate(
      { plan: sent, version },
      {
        onSuccess: (outcome) => {
          if (outcome.kind === 'saved') {
            setVersion(outcome.version);
            setBaseline(sent);
            setServerIssues({});
            setConflict(null);
            setStatus({ kind: 'saved', message: `Saved (version ${outcome.version}).` });
          } else if (outcome.kind === 'stale') {
            setConflict(outcome.current);
            setStatus({ kind: 'idle' });
          } else if (outcome.kind === 'invalid') {
            const byPath: Record<string, string> = {};
            for (const i of outcome.issues) byPath[i.path] = i.message;
            setServerIssues(byPath);
            const first = outcome.issues[0];
            if (first) setOpenStage(stageOfPath(first.path.split('.')));
            setStatus({ kind: 'error', message: `Not saved: ${outcome.message}` });
          } else {
            setStatus({ kind: 'error', message: `Not saved: ${outcome.message}` });
          }
        },
        onError: (error) => setStatus({ kind: 'error', message: `Not saved: ${error instanceof Error ? error.message : String(error)}` }),
      },
    );
  }, [hasInvalidText, save, version]);

  const onReloadTheirs = useCallback(() => {
    if (!conflict) return;
    const theirs = toDraft(conflict.plan);
    setBaseline(theirs);
    setVersion(conflict.version);
    replaceDraft(theirs, 'all');
    setServerIssues({});
    setConflict(null);
    setStatus({ kind: 'info', message: `Loaded the version saved by ${conflict.updatedByName}.` });
  }, [conflict, replaceDraft]);

  const openField = useCallback((stageId: StageId) => {
    setOpenStage(stageId);
    requestAnimationFrame(() => document.getElementById('stage-panel')?.scrollIntoView({ block: 'nearest', behavior: 'smooth' }));
  }, []);

  const nameInPlan = typeof draft.name === 'string' && draft.name.trim() !== '' ? draft.name : planName;
  const otherIssues = Object.entries(issues).filter(([path]) => !findField(path.split('.')));

  return (
    <div className="space-y-4 text-ink">
      <header className="flex flex-wrap items-center justify-between gap-3">
        <div className="flex flex-wrap items-center gap-3">
          <h2 className="text-xl font-semibold">{nameInPlan}</h2>
          {canEdit && dirty && (
            <span role="status" className="rounded-full bg-copper-light px-2.5 py-0.5 text-xs font-semibold text-copper-dark">
              Unsaved changes
            </span>
          )}
          {!canEdit && <span className="rounded-full bg-slate-100 px-2.5 py-0.5 text-xs font-medium text-ink-soft">Read-only</span>}
          <span className="text-xs text-ink-soft">version {version}</span>
        </div>
        <div className="flex items-center gap-3">
          <span className="text-xs tabular-nums text-ink-soft" aria-live="off" title="Time the channel engine took for the last evaluation in this browser">
            engine: {live.engineMs === null ? '—' : formatDurationMs(live.engineMs)}
          </span>
          {canEdit && <SaveBar onSave={onSave} saving={save.isPending} status={status} />}
        </div>
      </header>
      {canEdit && status.kind !== 'idle' && status.kind !== 'saving' && (
        <p role={status.kind === 'error' ? 'alert' : 'status'} className={`text-sm ${status.kind === 'error' ? 'text-verdict-fails' : 'text-ink-soft'}`}>
          {status.message}
        </p>
      )}
      {canEdit && conflict && <ConflictPanel conflict={conflict} baseline={baseline} draft={draft} onReload={onReloadTheirs} onDismiss={() => setConflict(null)} />}

      <ChainRow plan={draft} report={live.report} openStage={openStage} onOpen={(id) => setOpenStage((cur) => (cur === id ? null : id))} invalidStages={invalidStages} />

      <div id="stage-panel">
        {openStage &&
          (canEdit ? (
            <StageForm
              key={`${openStage}-${formEpoch}`}
              stageId={openStage}
              plan={draft}
              typed={typed.current}
              issues={issues}
              parts={parts}
              onEdit={onEdit}
              onTyped={onTyped}
              onChoosePart={(part) => onChoosePart(openStage, part)}
              onClose={() => setOpenStage(null)}
            />
          ) : (
            <StageValues stageId={openStage} plan={draft} onClose={() => setOpenStage(null)} />
          ))}
      </div>

      {(hasInvalidText || live.stale || otherIssues.length > 0 || live.engineError) && (
        <div role="status" className="rounded border border-verdict-marginal/50 bg-verdict-marginal/5 p-3 text-sm">
          {live.engineError && <p className="font-medium text-verdict-fails">The engine could not evaluate this plan: {live.engineError}</p>}
          {(hasInvalidText || live.stale) && (
            <p>
              Some values are not valid{live.report ? '; the results below use the last valid plan' : ''}.{' '}
              {live.issues.slice(0, 6).map((i) => (
                <span key={i.path + i.message} className="mr-2 inline-block">
                  <button type="button" className="underline" onClick={() => openField(stageOfPath(i.path.split('.')))}>
                    {findField(i.path.split('.'))?.field.label ?? (i.path || 'plan')}
                  </button>
                  : {i.message}
                </span>
              ))}
            </p>
          )}
          {otherIssues.length > 0 && (
            <ul className="mt-1 list-disc pl-5">
              {otherIssues.map(([path, message]) => (
                <li key={path}>
                  {path || 'plan'}: {message}
                </li>
              ))}
            </ul>
          )}
        </div>
      )}

      {live.report ? (
        <ResultViews
          report={live.report}
          plan={live.plan}
          canEdit={canEdit}
          onOpenStage={openField}
          onApplySuggestion={onApplySuggestion}
        />
      ) : (
        <p className="rounded border border-slate-200 bg-white p-4 text-sm text-ink-soft">No results yet: the plan has invalid values (see above).</p>
      )}
    </div>
  );
}
