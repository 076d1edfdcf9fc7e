/**
 * The design rationale as a PDF (server side, @react-pdf/renderer): title block in every page
 * header, cautions on the first page and in every footer, every input with its source, every
 * result table, vector plots drawn with react-pdf's Svg primitives, every check with its source,
 * assumptions and warnings, the review record with signatures, and the bench comparison.
 *
 * Plain data in, bytes out: no database, no routes.
 */
import * as React from 'react';
import { Document, Page, renderToBuffer, StyleSheet, Text, View } from '@react-pdf/renderer';
import type { ChannelPlan } from '@/lib/engine/plan';
import { profileFor } from '@/lib/engine/profiles';
import type { ChannelReport, Check, Verdict } from '@/lib/engine/report';
import { simulateImpulseTest } from '@/lib/engine/waveforms';
import { RATIONALE_CAUTION } from './cautions';
import { contentHash } from './content-hash';
import { dateTimeUtc, eng, engNumber, NOT_AVAILABLE, pdfText, percent } from './format';
import { registerPdfFonts, PDF_FONT_FAMILIES } from './pdf-fonts';
import { planInputSections } from './plan-inputs';
import { niceRange } from './plot-scales';
import { parseRationaleInput, type RationaleInput } from './rationale-input';
import { BarPlot, LinePlot, PLOT_COLORS, RangeBarPlot, type RangeBar, type Series } from './svg-plot';

void React;

/** Progress of a render: a named step and the fraction done (0–1). */
export type RenderProgress = { step: 'validating' | 'preparing' | 'laying-out' | 'done'; fraction: number };
export type RenderOptions = { onProgress?: (progress: RenderProgress) => void };

const PAGE_WIDTH_PT = 595.28; // A4
const PAGE_HEIGHT_PT = 841.89;
const MARGIN_X_PT = 36;
const CONTENT_WIDTH_PT = PAGE_WIDTH_PT - 2 * MARGIN_X_PT;

const VERDICT_COLORS: Record<Verdict, { fg: string; bg: string }> = {
  meets: { fg: '#14532d', bg: '#dcfce7' },
  marginal: { fg: '#713f12', bg: '#fef9c3' },
  fails: { fg: '#7f1d1d', bg: '#fee2e2' },
};

const STATE_LABELS: Record<RationaleInput['revision']['state'], string> = {
  draft: 'draft',
  'in-review': 'in review',
  released: 'released',
  'changes-requested': 'changes requested',
  superseded: 'superseded',
};

const s = StyleSheet.create({
  page: { fontFamily: PDF_FONT_FAMILIES as unknown as string, fontSize: 8, color: '#0f172a', paddingTop: 70, paddingBottom: 64, paddingHorizontal: MARGIN_X_PT, lineHeight: 1.3 },
  header: { position: 'absolute', top: 18, left: MARGIN_X_PT, right: MARGIN_X_PT, borderBottomWidth: 0.6, borderBottomColor: '#94a3b8', paddingBottom: 4 },
  headerRow: { flexDirection: 'row', justifyContent: 'space-between' },
  headerMain: { fontSize: 8, fontWeight: 700 },
  headerSub: { fontSize: 6.2, color: '#334155' },
  // Positioned from the top: a View anchored with `bottom` gets a runaway offset on long documents in react-pdf 4.
  footer: { position: 'absolute', top: PAGE_HEIGHT_PT - 52, left: MARGIN_X_PT, right: MARGIN_X_PT, borderTopWidth: 0.6, borderTopColor: '#94a3b8', paddingTop: 3, flexDirection: 'row', justifyContent: 'space-between' },
  footerCaution: { fontSize: 6, color: '#334155', width: CONTENT_WIDTH_PT - 70 },
  footerPage: { fontSize: 7, color: '#0f172a', textAlign: 'right', width: 64 },
  h1: { fontSize: 16, fontWeight: 700, marginBottom: 6 },
  h2: { fontSize: 11.5, fontWeight: 700, marginTop: 4, marginBottom: 5, color: '#1e3a8a' },
  h3: { fontSize: 9, fontWeight: 700, marginTop: 6, marginBottom: 3 },
  p: { marginBottom: 4 },
  small: { fontSize: 6.8, color: '#334155' },
  caution: { borderWidth: 1, borderColor: '#b45309', backgroundColor: '#fffbeb', padding: 6, marginVertical: 8 },
  cautionTitle: { fontWeight: 700, color: '#92400e', marginBottom: 2 },
  table: { marginBottom: 6 },
  tr: { flexDirection: 'row', borderBottomWidth: 0.4, borderBottomColor: '#cbd5e1' },
  th: { fontWeight: 700, backgroundColor: '#f1f5f9' },
  td: { paddingVertical: 1.6, paddingHorizontal: 3, fontSize: 7.2 },
  kv: { flexDirection: 'row', marginBottom: 1.5 },
  kvKey: { width: 170, color: '#334155' },
  kvValue: { flex: 1 },
  figure: { marginVertical: 6 },
  figureTitle: { fontSize: 8, fontWeight: 700, marginBottom: 2 },
  badge: { paddingHorizontal: 3, borderRadius: 2, fontWeight: 700 },
});

// ----------------------------------------------------------------------------------------------
// Building blocks

type Column = { header: string; flex: number; align?: 'left' | 'right' | 'center' };
type Cell = string | { text: string; verdict?: Verdict; bold?: boolean; color?: string };

function cellText(c: Cell): string {
  return typeof c === 'string' ? c : c.text;
}

/** A table whose header repeats on every page it spans; rows never split across pages. */
function Table(props: { columns: Column[]; rows: Cell[][] }) {
  return (
    <View style={s.table}>
      <View style={[s.tr, s.th]} fixed>
        {props.columns.map((c) => (
          <Text key={c.header} style={[s.td, { flex: c.flex, textAlign: c.align ?? 'left' }]}>
            {pdfText(c.header)}
          </Text>
        ))}
      </View>
      {props.rows.map((row, i) => (
        <View key={i} style={s.tr} wrap={false}>
          {row.map((cell, j) => {
            const col = props.columns[j];
            const verdict = typeof cell === 'string' ? undefined : cell.verdict;
            const style = [
              s.td,
              { flex: col.flex, textAlign: col.align ?? 'left' },
              ...(typeof cell !== 'string' && cell.bold ? [{ fontWeight: 700 }] : []),
              ...(typeof cell !== 'string' && cell.color ? [{ color: cell.color }] : []),
              ...(verdict ? [{ color: VERDICT_COLORS[verdict].fg, backgroundColor: VERDICT_COLORS[verdict].bg, fontWeight: 700 }] : []),
            ];
            return (
              <Text key={j} style={style as never}>
                {pdfText(cellText(cell))}
              </Text>
            );
          })}
        </View>
      ))}
    </View>
  );
}

function KeyValues(props: { rows: [string, string][] }) {
  return (
    <View style={{ marginBottom: 5 }}>
      {props.rows.map(([k, v]) => (
        <View key={k} style={s.kv} wrap={false}>
          <Text style={s.kvKey}>{pdfText(k)}</Text>
          <Text style={s.kvValue}>{pdfText(v)}</Text>
        </View>
      ))}
    </View>
  );
}

function Figure(props: { title: string; note?: string; children: React.ReactNode }) {
  return (
    <View style={s.figure} wrap={false}>
      <Text style={s.figureTitle}>{pdfText(props.title)}</Text>
      {props.children}
      {props.note ? <Text style={[s.small, { marginTop: 2 }]}>{pdfText(props.note)}</Text> : null}
    </View>
  );
}

function Section(props: { title: string; breakBefore?: boolean; children: React.ReactNode }) {
  return (
    <View break={props.breakBefore}>
      <Text style={s.h2} minPresenceAhead={60}>
        {pdfText(props.title)}
      </Text>
      {props.children}
    </View>
  );
}

function H3(props: { children: string }) {
  return (
    <Text style={s.h3} minPresenceAhead={40}>
      {pdfText(props.children)}
    </Text>
  );
}

function P(props: { children: string; small?: boolean }) {
  return <Text style={props.small ? [s.p, s.small] : s.p}>{pdfText(props.children)}</Text>;
}

// ----------------------------------------------------------------------------------------------
// Formatting of report values

/** A check's value or limit in its unit. */
export function checkValueText(value: number, unit: string): string {
  if (unit === 'fraction of range') return percent(value);
  return eng(value, unit === 'V/V' ? 'V/V' : unit);
}

/** Marks a source that is not verified against the primary text. */
export function sourceText(source: string, verified: boolean): string {
  if (verified) return source;
  return /from memory|common practice/i.test(source) ? `${source} [unverified]` : `${source} [unverified: from memory or secondary source]`;
}

/** A SHA-256 hex digest in two halves, so that table cells wrap it at a clean place. */
function splitHash(hash: string): string {
  return hash.length === 64 ? `${hash.slice(0, 32)} ${hash.slice(32)}` : hash;
}

function marginText(c: Check): string {
  if (!Number.isFinite(c.margin)) return NOT_AVAILABLE;
  if (c.limit === 0) return checkValueText(c.margin, c.unit);
  return percent(c.margin);
}

// ----------------------------------------------------------------------------------------------
// Page furniture

function Header(props: { data: RationaleInput }) {
  const { data } = props;
  return (
    <View style={s.header} fixed>
      <View style={s.headerRow}>
        <Text style={[s.headerMain, { flex: 1, paddingRight: 8 }]}>{pdfText(`${data.program.name} / ${data.plan.name}`)}</Text>
        <Text style={[s.headerMain, { width: 130, textAlign: 'right' }]}>{pdfText(`Revision ${data.revision.label} (${STATE_LABELS[data.revision.state]})`)}</Text>
      </View>
      <View style={s.headerRow}>
        <Text style={s.headerSub}>{pdfText(`Design rationale; revision created ${dateTimeUtc(data.revision.createdAt)} by ${data.revision.createdByName}; content hash SHA-256 ${data.revision.contentHash}`)}</Text>
      </View>
    </View>
  );
}

function Footer(props: { data: RationaleInput }) {
  return (
    <View style={s.footer} fixed>
      <Text style={s.footerCaution}>{pdfText(`${RATIONALE_CAUTION} Generated ${dateTimeUtc(props.data.generatedAt)} by ${props.data.generatedByName}.`)}</Text>
      <Text style={s.footerPage} render={({ pageNumber, totalPages }) => `Page ${pageNumber} of ${totalPages}`} />
    </View>
  );
}

// ----------------------------------------------------------------------------------------------
// Sections

function TitlePage(props: { data: RationaleInput; hashIntact: boolean | null }) {
  const { data, hashIntact } = props;
  const report = data.report;
  const profile = safeProfile(data.planInput);
  const counts = { meets: 0, marginal: 0, fails: 0 };
  for (const c of report.checks) counts[c.verdict] += 1;
  const notMet = report.checks.filter((c) => c.verdict !== 'meets');
  return (
    <View>
      <Text style={s.h1}>Design rationale</Text>
      <KeyValues
        rows={[
          ['Program', data.program.name],
          ['Channel plan', data.plan.name],
          ['Revision', `${data.revision.label}, ${STATE_LABELS[data.revision.state]}`],
          ['Revision created', `${dateTimeUtc(data.revision.createdAt)} by ${data.revision.createdByName}`],
          ['Content hash (SHA-256 of plan and report)', data.revision.contentHash],
          ['Hash of the data in this document', hashIntact === null ? 'could not be computed' : hashIntact ? 'matches the revision' : 'DIFFERS from the revision: this document does not show the recorded revision'],
          ['Engine version', report.engineVersion],
          ['Exported', `${dateTimeUtc(data.generatedAt)} by ${data.generatedByName}`],
        ]}
      />
      <View style={s.caution} wrap={false}>
        <Text style={s.cautionTitle}>Caution</Text>
        <Text>{pdfText(RATIONALE_CAUTION)}</Text>
      </View>
      <H3>The job</H3>
      <P>
        {`This document sets out the analog acquisition channel "${data.plan.name}" stage by stage (electrodes, input protection, instrumentation amplifier, high-pass, gain and anti-alias low-pass, converter) and the reasoning that it handles the application: that the worst-case electrode DC offset does not saturate the instrumentation stage at the chosen gain, that the high-pass removes it without distorting the signal beyond the profile's limits, that the noise and the mains interference referred to the input meet the profile, and that the converter resolves the signal with margin. Every number comes from the plan below through published methods; every check names its source.`}
      </P>
      <H3>Scope</H3>
      <KeyValues
        rows={[
          ['Requirement profile', profile ? `${profile.name}: ${profile.description}` : report.profile.name],
          ['Band of interest', profile ? `${eng(profile.band.lowHz, 'Hz')} to ${eng(profile.band.highHz, 'Hz')}` : NOT_AVAILABLE],
          ['Mains frequency', eng(data.planInput.mainsHz, 'Hz')],
          ['Applied part', `type ${data.planInput.appliedPart} (IEC 60601-1 patient-current limits)`],
          ['Change summary', data.revision.changeSummary || 'none given'],
        ]}
      />
      <H3>Result at a glance</H3>
      <P>{`${report.checks.length} checks: ${counts.meets} meets, ${counts.marginal} marginal, ${counts.fails} fails.`}</P>
      {notMet.length > 0 ? (
        <Table
          columns={[
            { header: 'Check not met with margin', flex: 3 },
            { header: 'Value', flex: 1.2, align: 'right' },
            { header: 'Limit', flex: 1.2, align: 'right' },
            { header: 'Verdict', flex: 0.9, align: 'center' },
          ]}
          rows={notMet.map((c) => [c.title, checkValueText(c.value, c.unit), `${c.sense === 'atMost' ? '<=' : '>='} ${checkValueText(c.limit, c.unit)}`, { text: c.verdict, verdict: c.verdict }])}
        />
      ) : (
        <P>Every check of the profile is met with margin.</P>
      )}
      <P small>
        Verdicts: meets = within the limit with margin; marginal = within the limit but closer than the engine's margin; fails = beyond the limit. Sources marked
        [unverified] were recalled from memory or taken from common practice or a secondary source and must be checked against the primary text.
      </P>
    </View>
  );
}

function safeProfile(plan: ChannelPlan) {
  try {
    return profileFor(plan.profileId, plan.customProfile);
  } catch {
    return null;
  }
}

function InputsSection(props: { plan: ChannelPlan }) {
  return (
    <Section title="1  Inputs" breakBefore>
      <P small>Every value of the plan, in engineering notation, with where it comes from (part library entry or datasheet as named in the plan, a plan entry, a profile default, or an engine assumption).</P>
      {planInputSections(props.plan).map((section) => (
        // A stage's inputs (at most a few dozen rows) stay on one page with their title and source note.
        <View key={section.title} wrap={section.rows.length > 25}>
          <H3>{section.title}</H3>
          {section.partSource ? <P small>{`Source of the part values: ${section.partSource}`}</P> : null}
          <Table
            columns={[
              { header: 'Quantity', flex: 2.4 },
              { header: 'Value', flex: 1.3, align: 'right' },
              { header: 'Source', flex: 3 },
            ]}
            rows={section.rows.map((r) => [r.label, r.value, r.source])}
          />
        </View>
      ))}
    </Section>
  );
}

function LevelsSection(props: { report: ChannelReport }) {
  const r = props.report;
  const nodes = r.stages.flatMap((st) => st.nodes.map((n) => ({ stage: st.name, n })));
  const rows: RangeBar[] = nodes.map(({ n }) => ({ label: n.name, allowedLow: n.lowLimitV, allowedHigh: n.highLimitV, reachedLow: n.minV, reachedHigh: n.maxV, ok: n.headroomV >= 0 }));
  const range = niceRange(nodes.flatMap(({ n }) => [n.minV, n.maxV, n.lowLimitV, n.highLimitV]), 'linear');
  const cm = r.commonModeWindow;
  return (
    <Section title="2  Levels and headroom" breakBefore>
      <KeyValues
        rows={[
          ['First-stage gain G1 = 1 + 2R/Rg', `${eng(r.gains.g1, 'V/V', 4)} (Rg = ${eng(r.gains.rgOhm, 'Ω')})`],
          ['Difference-stage gain Gd', eng(r.gains.gd, 'V/V', 4)],
          ['Second-stage gain G2', eng(r.gains.g2, 'V/V', 4)],
          ['Total mid-band gain', `${eng(r.gains.totalGain, 'V/V', 4)} (${eng(20 * Math.log10(r.gains.totalGain), 'dB')})`],
          ['Worst-case differential DC input', `+/- ${eng(r.worstCaseInputV, 'V', 4)} (offset, bias and lead-off terms, op-amp offsets, signal)`],
          ['Largest offset-safe first-stage gain', `${eng(r.maxFirstStageGain, 'V/V', 4)}, limited by ${r.maxFirstStageGainDetail.limitingNode}${r.maxFirstStageGainDetail.rgOhm !== null ? ` (Rg >= ${eng(r.maxFirstStageGainDetail.rgOhm, 'Ω')})` : ''}`],
          [
            'Common-mode window at that input',
            cm.minV <= cm.maxV
              ? `${eng(cm.minV, 'V', 4)} to ${eng(cm.maxV, 'V', 4)} (Vd = ${eng(cm.vdV, 'V', 4)})`
              : `empty: no common-mode voltage keeps every first-stage node in range at Vd = ${eng(cm.vdV, 'V', 4)}`,
          ],
        ]}
      />
      <Table
        columns={[
          { header: 'Stage', flex: 1.6 },
          { header: 'Node', flex: 1.6 },
          { header: 'Lowest', flex: 1, align: 'right' },
          { header: 'Highest', flex: 1, align: 'right' },
          { header: 'Allowed low', flex: 1, align: 'right' },
          { header: 'Allowed high', flex: 1, align: 'right' },
          { header: 'Headroom', flex: 1, align: 'right' },
          { header: 'of range', flex: 0.8, align: 'right' },
        ]}
        rows={nodes.map(({ stage, n }) => {
          const bad = n.headroomV < 0;
          const color = bad ? VERDICT_COLORS.fails.fg : undefined;
          return [stage, n.name, eng(n.minV, 'V', 4), eng(n.maxV, 'V', 4), eng(n.lowLimitV, 'V', 4), eng(n.highLimitV, 'V', 4), { text: eng(n.headroomV, 'V', 3), color, bold: bad }, { text: percent(n.headroomFraction), color, bold: bad }];
        })}
      />
      {rows.length > 0 ? (
        <Figure title="Node voltages against their allowed ranges" note="Worst-case offset, signal and mains common mode; a red bar reaches beyond the node's limit (op-amp swing, input common-mode range or converter full scale).">
          <RangeBarPlot width={CONTENT_WIDTH_PT} x={{ kind: 'linear', ...range, title: 'Node voltage (V)' }} rows={rows} labelWidthPt={120} />
        </Figure>
      ) : null}
    </Section>
  );
}

function ResponseSection(props: { report: ChannelReport }) {
  const resp = props.report.response;
  const fAll = resp.points.map((p) => p.fHz);
  const xRange = niceRange(fAll, 'log');
  const x = { kind: 'log' as const, ...xRange, title: 'Frequency (Hz)' };
  const total: Series = { label: 'whole chain', color: PLOT_COLORS[0], points: resp.points.map((p) => ({ x: p.fHz, y: p.magDb })), widthPt: 1.6 };
  const stageNames: Record<string, string> = { input: 'input network', instrumentation: 'instrumentation stage', 'high-pass': 'high-pass', 'gain-stage': 'gain and anti-alias stage' };
  const stages: Series[] = resp.stages.map((st, i) => ({ label: stageNames[st.id] ?? st.id, color: PLOT_COLORS[(i + 1) % PLOT_COLORS.length], points: st.points.map((p) => ({ x: p.fHz, y: p.magDb })), dashed: true, widthPt: 0.8 }));
  const magValues = [...total.points, ...stages.flatMap((st) => st.points)].map((p) => p.y);
  const magMax = Math.max(...magValues.filter(Number.isFinite));
  const magRange = niceRange([magMax + 5, Math.max(magMax - 120, Math.min(...magValues.filter(Number.isFinite)))], 'linear');
  const phase: Series = { label: 'whole chain', color: PLOT_COLORS[0], points: resp.points.map((p) => ({ x: p.fHz, y: p.phaseDeg })), widthPt: 1.2 };
  const phaseRange = niceRange(phase.points.map((p) => p.y), 'linear');
  const refs = [
    ...(resp.lowCornerHz > 0 ? [{ axis: 'x' as const, value: resp.lowCornerHz, label: `${eng(resp.lowCornerHz, 'Hz')}`, color: '#15803d' }] : []),
    { axis: 'x' as const, value: resp.highCornerHz, label: `${eng(resp.highCornerHz, 'Hz')}`, color: '#15803d' },
  ];
  return (
    <Section title="3  Frequency response" breakBefore>
      <KeyValues
        rows={[
          ['Low -3 dB corner', resp.lowCornerHz === 0 ? '0 Hz (DC-coupled)' : eng(resp.lowCornerHz, 'Hz', 4)],
          ['High -3 dB corner', eng(resp.highCornerHz, 'Hz', 4)],
          ['Mid-band gain', `${eng(resp.midbandGainDb, 'dB', 4)} at ${eng(resp.midbandHz, 'Hz')}`],
          ['Attenuation of the first alias (fs - band high)', eng(resp.aliasAttenuationDb, 'dB')],
          ['Attenuation at fs/2', eng(resp.attenuationAtNyquistDb, 'dB')],
        ]}
      />
      <Figure title="Magnitude of the whole chain and of each stage" note="Dashed: single stages; green lines: the -3 dB corners of the whole chain.">
        <LinePlot width={CONTENT_WIDTH_PT} height={200} x={x} y={{ kind: 'linear', ...magRange, title: 'Magnitude (dB)' }} series={[total, ...stages]} references={refs} />
      </Figure>
      <Figure title="Phase of the whole chain">
        <LinePlot width={CONTENT_WIDTH_PT} height={150} x={x} y={{ kind: 'linear', ...phaseRange, title: 'Phase (degrees)' }} series={[phase]} references={refs} legend={false} />
      </Figure>
    </Section>
  );
}

function ImpulseSection(props: { report: ChannelReport; trace: ReturnType<typeof simulateImpulseTest> | null; traceError: string | null }) {
  const { report, trace } = props;
  const it = report.impulseTest;
  const rec = report.recovery;
  const seriesIn: Series | null = trace ? { label: 'input pulse', color: '#94a3b8', points: trace.input.timeS.map((t, i) => ({ x: t, y: trace.input.values[i] * 1e3 })) } : null;
  const seriesOut: Series | null = trace ? { label: 'chain output referred to input', color: PLOT_COLORS[0], points: trace.output.timeS.map((t, i) => ({ x: t, y: trace.output.values[i] * 1e3 })), widthPt: 1.3 } : null;
  const tMax = trace ? Math.max(...trace.output.timeS) : 1;
  const yRange = trace ? niceRange([...trace.input.values, ...trace.output.values].map((v) => v * 1e3), 'linear') : { min: 0, max: 1 };
  return (
    <Section title="4  Low-frequency impulse test and overload recovery">
      <Table
        columns={[
          { header: 'Quantity', flex: 3 },
          { header: 'Value', flex: 1.4, align: 'right' },
        ]}
        rows={[
          ['Test pulse', `${eng(it.amplitudeV, 'V')} for ${eng(it.durationS, 's')}`],
          ['Largest baseline displacement after the pulse (RTI)', eng(it.displacementV, 'V')],
          ['Largest slope after the pulse (RTI)', eng(it.slopeVPerS, 'V/s')],
          ['Overload step applied at the input', eng(rec.stepV, 'V')],
          ['Residual band at the high-pass output', eng(rec.bandV, 'V')],
          ['Recovery time into that band', rec.timeS === null ? 'never (DC-coupled and saturated)' : eng(rec.timeS, 's')],
        ]}
      />
      {trace && seriesIn && seriesOut ? (
        <Figure title="Impulse test in the time domain" note={`Rectangular pulse of ${eng(trace.amplitudeV, 'V')} for ${eng(trace.widthS, 's')} through the linear chain (no offset, noise or clipping); time-domain simulation at ${eng(trace.sampleRateHz, 'Hz')}.`}>
          <LinePlot width={CONTENT_WIDTH_PT} height={170} x={{ kind: 'linear', min: 0, max: tMax, title: 'Time (s)' }} y={{ kind: 'linear', ...yRange, title: 'Voltage referred to input (mV)' }} series={[seriesIn, seriesOut]} references={[{ axis: 'y', value: 0, label: 'baseline', color: '#64748b' }]} />
        </Figure>
      ) : (
        <P small>{`The impulse-test trace could not be simulated${props.traceError ? ` (${props.traceError})` : ''}; the values above come from the closed-form response.`}</P>
      )}
    </Section>
  );
}

function NoiseSection(props: { report: ChannelReport }) {
  const n = props.report.noise;
  const names = n.contributions.map((c) => c.name).filter((name) => n.densityPoints.some((p) => (p.byContributor[name] ?? 0) > 0));
  const series: Series[] = [
    { label: 'total', color: '#0f172a', points: n.densityPoints.map((p) => ({ x: p.fHz, y: p.totalVPerRtHz })), widthPt: 1.8 },
    ...names.map((name, i) => ({ label: name, color: PLOT_COLORS[(i + 1) % PLOT_COLORS.length], points: n.densityPoints.map((p) => ({ x: p.fHz, y: p.byContributor[name] ?? 0 })), widthPt: 0.9 })),
  ];
  const yValues = series.flatMap((sr) => sr.points.map((p) => p.y)).filter((v) => v > 0);
  const yMax = Math.max(...yValues);
  // Show four decades below the largest density: smaller contributors do not matter to the total.
  const yRange = niceRange([yMax, Math.max(Math.min(...yValues), yMax / 1e4)], 'log');
  const xRange = niceRange(n.densityPoints.map((p) => p.fHz), 'log');
  return (
    <Section title="5  Noise referred to input" breakBefore>
      <KeyValues
        rows={[
          ['Integration band', `${eng(n.bandLowHz, 'Hz')} to ${eng(n.bandHighHz, 'Hz')}`],
          ['Total noise RTI', `${eng(n.rtiRmsV, 'V rms')}, ${eng(n.rtiPpV, 'V')} peak-to-peak (6.6 x rms, common practice for Gaussian noise)`],
          ['Physical floor (electrode source impedance alone)', eng(n.floorRmsV, 'V rms')],
        ]}
      />
      <Table
        columns={[
          { header: 'Contributor', flex: 3 },
          { header: 'Stage', flex: 1.3 },
          { header: 'rms RTI', flex: 1.1, align: 'right' },
          { header: 'Share of power', flex: 1.1, align: 'right' },
        ]}
        rows={n.contributions.map((c) => [c.name, c.stageId, eng(c.rmsV, 'V'), percent(c.share)])}
      />
      <Figure title="Noise density referred to input, by contributor" note="Densities in V/rtHz; contributors that are zero throughout are left out.">
        <LinePlot width={CONTENT_WIDTH_PT} height={220} x={{ kind: 'log', ...xRange, title: 'Frequency (Hz)' }} y={{ kind: 'log', ...yRange, title: 'Noise density (V/rtHz)' }} series={series} />
      </Figure>
    </Section>
  );
}

function MainsSection(props: { report: ChannelReport; mainsLimitPpV: number | null }) {
  const { cmrr, interference } = props.report;
  const cmrrRange = niceRange(cmrr.points.map((p) => p.cmrrDb), 'linear');
  const bars = [...interference.terms.map((t, i) => ({ label: t.name, value: t.rtiPpV, color: PLOT_COLORS[(i + 1) % PLOT_COLORS.length] })), { label: 'total (terms in magnitude)', value: interference.rtiPpV, color: '#0f172a' }];
  const fitted = niceRange(bars.map((b) => b.value), 'log', props.mainsLimitPpV !== null ? [props.mainsLimitPpV] : []);
  // A limit on the axis end would hide under the frame: leave a decade beyond it.
  const barRange = props.mainsLimitPpV !== null && props.mainsLimitPpV >= fitted.max * 0.999 ? { min: fitted.min, max: fitted.max * 10 } : fitted;
  const cmTest = interference.cmrTest;
  return (
    <Section title="6  Common-mode rejection and mains interference">
      <Table
        columns={[
          { header: 'CMRR of the instrumentation stage', flex: 3 },
          { header: 'Value', flex: 1.2, align: 'right' },
        ]}
        rows={[
          ['At DC', eng(cmrr.dcDb, 'dB')],
          ['At mains frequency', eng(cmrr.mainsDb, 'dB')],
          ['Worst case over the band and mains', eng(cmrr.worstCaseDb, 'dB')],
          ['Resistor-limited worst case G1 (1 + Gd)/(4t)', eng(cmrr.resistorLimitedDb, 'dB')],
        ]}
      />
      {cmrr.points.length > 1 ? (
        <Figure title="CMRR against frequency">
          <LinePlot
            width={CONTENT_WIDTH_PT}
            height={140}
            x={{ kind: 'log', ...niceRange(cmrr.points.map((p) => p.fHz), 'log'), title: 'Frequency (Hz)' }}
            y={{ kind: 'linear', ...cmrrRange, title: 'CMRR (dB)' }}
            series={[{ label: 'CMRR', color: PLOT_COLORS[0], points: cmrr.points.map((p) => ({ x: p.fHz, y: p.cmrrDb })), widthPt: 1.3 }]}
            legend={false}
          />
        </Figure>
      ) : null}
      <H3>Mains interference in use</H3>
      <KeyValues rows={[['Body common-mode voltage at mains frequency', eng(interference.bodyCmV, 'V rms')]]} />
      <Table
        columns={[
          { header: 'Term', flex: 3 },
          { header: 'RTI, peak-to-peak', flex: 1.2, align: 'right' },
        ]}
        rows={[
          ...interference.terms.map((t) => [t.name, eng(t.rtiPpV, 'V')]),
          [{ text: 'Total referred to input (terms added in magnitude)', bold: true }, { text: eng(interference.rtiPpV, 'V'), bold: true }],
          ['Right-leg drive at its current limit', interference.rightLegDriveSaturated ? 'yes: no reduction credited' : 'no'],
        ]}
      />
      <Figure title="Mains interference terms referred to input">
        <BarPlot
          width={CONTENT_WIDTH_PT}
          x={{ kind: 'log', ...barRange, title: 'Interference referred to input, peak-to-peak (V)' }}
          bars={bars}
          labelWidthPt={190}
          limit={props.mainsLimitPpV !== null ? { value: props.mainsLimitPpV, label: `limit ${eng(props.mainsLimitPpV, 'V')}` } : undefined}
        />
      </Figure>
      <H3>Common-mode rejection test of the profile</H3>
      {cmTest ? (
        <KeyValues
          rows={[
            ['Common mode at the leads in the test', eng(cmTest.vcmRms, 'V rms')],
            ['Result referred to input', eng(cmTest.rtiPpV, 'V')],
            ['Limit', eng(cmTest.limitPpV, 'V')],
          ]}
        />
      ) : (
        <P>The profile has no common-mode rejection test.</P>
      )}
    </Section>
  );
}

function ConverterAndCurrentsSection(props: { report: ChannelReport }) {
  const { adc, patientCurrents: pc } = props.report;
  return (
    <Section title="7  Converter and patient currents">
      <Table
        columns={[
          { header: 'Converter', flex: 3 },
          { header: 'Value', flex: 1.4, align: 'right' },
        ]}
        rows={[
          ['LSB at the converter', eng(adc.lsbV, 'V')],
          ['LSB referred to input', eng(adc.lsbRtiV, 'V')],
          ['Full-scale span referred to input', eng(adc.rangeRtiV, 'V')],
          ['Ideal SNR (6.02 N + 1.76 dB)', eng(adc.snrIdealDb, 'dB')],
          ['Offset plus signal within full scale', adc.fitsOffset ? 'yes' : 'no'],
          ['Codes spanned by the peak-to-peak signal', engNumber(adc.codesSpanned, 4)],
        ]}
      />
      <Table
        columns={[
          { header: 'Patient currents (IEC 60601-1 limits)', flex: 3 },
          { header: 'Value', flex: 1.1, align: 'right' },
          { header: 'Normal limit', flex: 1.1, align: 'right' },
          { header: 'Single-fault limit', flex: 1.1, align: 'right' },
        ]}
        rows={[
          ['DC current per lead (bias and DC lead-off)', eng(pc.dcA, 'A'), eng(pc.limitNormalA, 'A'), eng(pc.limitSingleFaultA, 'A')],
          ['AC current per lead (AC lead-off)', eng(pc.acA, 'A rms'), eng(pc.limitNormalAcA, 'A'), eng(pc.limitSingleFaultAcA, 'A')],
          ['Right-leg driver with its output at a rail (single fault)', pc.rightLegFaultA === 0 ? 'no driver' : eng(pc.rightLegFaultA, 'A'), NOT_AVAILABLE, eng(pc.limitSingleFaultA, 'A')],
        ]}
      />
      <P small>Patient currents computed here cover only the channel's own bias, lead-off and driver currents; patient leakage of the whole device must be designed and measured separately.</P>
    </Section>
  );
}

function ChecksSection(props: { report: ChannelReport }) {
  return (
    <Section title="8  Checks" breakBefore>
      <Table
        columns={[
          { header: 'Check', flex: 2.4 },
          { header: 'Value', flex: 1, align: 'right' },
          { header: 'Limit', flex: 1.1, align: 'right' },
          { header: 'Margin', flex: 0.9, align: 'right' },
          { header: 'Verdict', flex: 0.9, align: 'center' },
          { header: 'Source', flex: 3 },
        ]}
        rows={props.report.checks.map((c) => [
          c.title,
          checkValueText(c.value, c.unit),
          `${c.sense === 'atMost' ? '<=' : '>='} ${checkValueText(c.limit, c.unit)}`,
          marginText(c),
          { text: c.verdict, verdict: c.verdict },
          sourceText(c.source, c.sourceVerified),
        ])}
      />
      <P small>Margin: (limit - value)/|limit| for an upper limit, (value - limit)/|limit| for a lower one; for a zero limit the difference itself.</P>
    </Section>
  );
}

function NotesSection(props: { report: ChannelReport }) {
  const r = props.report;
  return (
    <Section title="9  Suggestions, assumptions and warnings">
      <H3>Suggestions of the engine</H3>
      {r.suggestions.length > 0 ? (
        <Table
          columns={[
            { header: 'For check', flex: 1.3 },
            { header: 'Suggestion', flex: 2 },
            { header: 'Why', flex: 3.5 },
          ]}
          rows={r.suggestions.map((sg) => [sg.checkId, sg.title, sg.detail])}
        />
      ) : (
        <P>None.</P>
      )}
      <H3>Assumptions</H3>
      {r.assumptions.map((a, i) => (
        <Text key={i} style={s.p}>{pdfText(`- ${a}`)}</Text>
      ))}
      <H3>Warnings</H3>
      {r.warnings.length > 0 ? r.warnings.map((w) => <Text key={w.id} style={s.p}>{pdfText(`- ${w.message}`)}</Text>) : <P>None.</P>}
    </Section>
  );
}

function ReviewSection(props: { data: RationaleInput }) {
  const { review, revision } = props.data;
  return (
    <Section title="10  Review record">
      <KeyValues
        rows={[
          ['Review requested', review.requestedAt ? dateTimeUtc(review.requestedAt) : 'not requested'],
          ['Reviewers', review.reviewers.length > 0 ? review.reviewers.map((r) => (r.role ? `${r.name} (${r.role})` : r.name)).join(', ') : 'none'],
        ]}
      />
      <H3>Comments</H3>
      {review.comments.length > 0 ? (
        <Table
          columns={[
            { header: 'When', flex: 1.2 },
            { header: 'Author', flex: 1.1 },
            { header: 'Anchored to', flex: 1.1 },
            { header: 'Comment', flex: 4 },
            { header: 'Status', flex: 0.8 },
          ]}
          rows={review.comments.map((c) => [dateTimeUtc(c.at), c.authorName, [c.stageId, c.checkId].filter(Boolean).join(' / ') || 'whole plan', c.body, c.resolved ? 'resolved' : 'open'])}
        />
      ) : (
        <P>No comments.</P>
      )}
      <H3>Signatures</H3>
      {review.signatures.length > 0 ? (
        <Table
          columns={[
            { header: 'Signer', flex: 1.3 },
            { header: 'Role', flex: 0.9 },
            { header: 'Meaning', flex: 1.2 },
            { header: 'When', flex: 1.2 },
            { header: 'Content hash signed', flex: 3.2 },
          ]}
          rows={review.signatures.map((sg) => [
            sg.signerName,
            sg.role,
            { text: sg.meaning === 'approved' ? 'approved' : 'changes requested', color: sg.meaning === 'approved' ? VERDICT_COLORS.meets.fg : VERDICT_COLORS.fails.fg, bold: true },
            dateTimeUtc(sg.at),
            `${splitHash(sg.contentHash)}\n${sg.contentHash === revision.contentHash ? '(this revision)' : '(a DIFFERENT content: not this revision)'}`,
          ])}
        />
      ) : (
        <P>No signatures.</P>
      )}
      <P small>A signature records the content hash the signer saw; it approves that content only. It is a record of the team's review, not a certification.</P>
    </Section>
  );
}

function BenchSection(props: { data: RationaleInput }) {
  const bench = props.data.bench;
  return (
    <Section title="11  Bench comparison">
      {bench && bench.rows.length > 0 ? (
        <View>
          {bench.recordName ? <P>{`Record: ${bench.recordName}`}</P> : null}
          <Table
            columns={[
              { header: 'Quantity', flex: 2.6 },
              { header: 'Predicted', flex: 1.1, align: 'right' },
              { header: 'Measured', flex: 1.1, align: 'right' },
              { header: 'Measured / predicted', flex: 1.1, align: 'right' },
              { header: 'Agreement', flex: 1, align: 'center' },
            ]}
            rows={bench.rows.map((b) => [
              b.quantity,
              eng(b.predicted, b.unit ?? ''),
              eng(b.measured, b.unit ?? ''),
              b.ratio === null ? '—' : eng(b.ratio, '', 3),
              b.ratio === null ? 'no prediction' : { text: b.within ? 'within' : 'outside', verdict: b.within ? 'meets' : 'fails' },
            ])}
          />
        </View>
      ) : (
        <P>No bench record is attached to this revision.</P>
      )}
    </Section>
  );
}

function ClosingCautions() {
  return (
    <Section title="Cautions">
      <View style={s.caution} wrap={false}>
        <Text>{pdfText(RATIONALE_CAUTION)}</Text>
      </View>
      <P small>
        The results in this document are computed from the plan's values with the methods named beside each result; they are predictions, not measurements. Values marked [unverified] must be
        checked against the primary standard text before the design relies on them.
      </P>
    </Section>
  );
}

/** The whole document as a React element (exported for tests that inspect the tree). */
export function RationaleDocument(props: { data: RationaleInput; trace: ReturnType<typeof simulateImpulseTest> | null; traceError: string | null; hashIntact: boolean | null }) {
  const { data } = props;
  const profile = safeProfile(data.planInput);
  const mainsLimit = profile?.checks.mainsInterferencePpV?.value ?? null;
  return (
    <Document
      title={pdfText(`Design rationale: ${data.plan.name}, revision ${data.revision.label}`)}
      author={pdfText(data.generatedByName)}
      subject={pdfText(`${data.program.name} / ${data.plan.name}`)}
      keywords={`content-hash:${data.revision.contentHash}`}
      creator="Channelsmith"
      producer="Channelsmith"
      language="en"
    >
      <Page size="A4" style={s.page}>
        <Header data={data} />
        <Footer data={data} />
        <TitlePage data={data} hashIntact={props.hashIntact} />
        <InputsSection plan={data.planInput} />
        <LevelsSection report={data.report} />
        <ResponseSection report={data.report} />
        <ImpulseSection report={data.report} trace={props.trace} traceError={props.traceError} />
        <NoiseSection report={data.report} />
        <MainsSection report={data.report} mainsLimitPpV={mainsLimit} />
        <ConverterAndCurrentsSection report={data.report} />
        <ChecksSection report={data.report} />
        <NotesSection report={data.report} />
        <ReviewSection data={data} />
        <BenchSection data={data} />
        <ClosingCautions />
      </Page>
    </Document>
  );
}

/**
 * Renders the design rationale of a revision as PDF bytes.
 * @param input the export data (validated here; see `parseRationaleInput`)
 * @param options `onProgress` is called with each step and the fraction done
 * @returns the PDF file's bytes
 * @throws RationaleInputError naming the offending field for bad input (nothing is rendered)
 */
export async function renderRationalePdf(input: unknown, options: RenderOptions = {}): Promise<Uint8Array> {
  const progress = (step: RenderProgress['step'], fraction: number) => options.onProgress?.({ step, fraction });
  progress('validating', 0);
  const data = parseRationaleInput(input);
  progress('preparing', 0.1);
  registerPdfFonts();
  let trace: ReturnType<typeof simulateImpulseTest> | null = null;
  let traceError: string | null = null;
  try {
    trace = simulateImpulseTest(data.planInput, { maxDisplayPoints: 600, windowS: 3 });
  } catch (cause) {
    traceError = cause instanceof Error ? cause.message : String(cause);
  }
  let hashIntact: boolean | null = null;
  try {
    hashIntact = contentHash({ plan: data.planInput, report: data.report }) === data.revision.contentHash;
  } catch {
    hashIntact = null;
  }
  progress('laying-out', 0.3);
  const buffer = await renderToBuffer(<RationaleDocument data={data} trace={trace} traceError={traceError} hashIntact={hashIntact} />);
  progress('done', 1);
  return new Uint8Array(buffer.buffer, buffer.byteOffset, buffer.byteLength);
}
