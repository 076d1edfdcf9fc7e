/**
 * A verdict shown with text and colour (never colour alone).
 */
import type { Verdict } from '@/lib/engine/report';

const styles: Record<Verdict, string> = {
  meets: 'bg-verdict-meets/10 text-verdict-meets border-verdict-meets/40',
  marginal: 'bg-verdict-marginal/10 text-verdict-marginal border-verdict-marginal/40',
  fails: 'bg-verdict-fails/10 text-verdict-fails border-verdict-fails/40',
};
const symbols: Record<Verdict, string> = { meets: '✓', marginal: '!', fails: '✗' };

export function VerdictBadge({ verdict }: { verdict: Verdict }) {
  return (
    <span className={`inline-flex items-center gap-1 rounded border px-1.5 py-0.5 text-xs font-semibold ${styles[verdict]}`}>
      <span aria-hidden="true">{symbols[verdict]}</span>
      {verdict}
    </span>
  );
}
