'use client';
import type { ChannelPlan } from '@/lib/engine/plan';

export function ToleranceView({ plan }: { plan: ChannelPlan | null }) {
  return <p className="text-sm">Tolerance analysis {plan ? '' : '(no valid plan)'}</p>;
}
