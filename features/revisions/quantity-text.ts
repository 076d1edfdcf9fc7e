/**
 * Units of plan fields and report values, read from their names (the project's convention puts
 * the SI unit at the end of every numeric name: `rgOhm`, `fcHz`, `offsetV`, `enVPerRtHz`), and the
 * text they are shown with.
 */
import { formatQuantity } from '@/lib/units/format-quantity';
import type { ExpectedUnit } from '@/lib/units/parse-quantity';

/** How a value is shown: an SI unit with an engineering prefix, a percentage, or a plain number with a suffix. */
export type DisplayUnit =
  | { kind: 'si'; unit: ExpectedUnit; suffix?: string }
  | { kind: 'percent' }
  | { kind: 'plain'; suffix: string };

/**
 * The display unit of a plan field or report value from its last name segment.
 * @example unitForFieldName('rgOhm') // { kind: 'si', unit: 'ohm' }
 */
export function unitForFieldName(name: string): DisplayUnit {
  if (/PerRtHz$/.test(name)) return { kind: 'si', unit: name.endsWith('APerRtHz') ? 'A/rtHz' : 'V/rtHz' };
  if (/VPerS$/.test(name)) return { kind: 'si', unit: 'V', suffix: '/s' };
  if (/Hz$/.test(name)) return { kind: 'si', unit: 'Hz' };
  if (/Ohm$/.test(name)) return { kind: 'si', unit: 'ohm' };
  if (/Db$/.test(name)) return { kind: 'si', unit: 'dB' };
  if (/Vrms$/.test(name)) return { kind: 'si', unit: 'V', suffix: ' rms' };
  if (/PpV$/.test(name)) return { kind: 'si', unit: 'V', suffix: ' p-p' };
  if (/[a-z0-9]V$/.test(name)) return { kind: 'si', unit: 'V' };
  if (/[a-z0-9]A$/.test(name)) return { kind: 'si', unit: 'A' };
  if (/[a-z0-9]F$/.test(name)) return { kind: 'si', unit: 'F' };
  if (/[a-z0-9]S$/.test(name)) return { kind: 'si', unit: 's' };
  if (/[a-z0-9]K$/.test(name)) return { kind: 'plain', suffix: ' K' };
  if (/(Tolerance|Mismatch|Fraction|share)$/i.test(name)) return { kind: 'percent' };
  if (/(^g1$|^g2$|^gd$|[gG]ain$)/.test(name)) return { kind: 'plain', suffix: ' V/V' };
  if (name === 'bits') return { kind: 'plain', suffix: ' bits' };
  return { kind: 'plain', suffix: '' };
}

/** The display unit for a check's `unit` text as the engine writes it ("V", "Hz", "dB", "V/V", "fraction of range"). */
export function unitForCheckUnit(unit: string): DisplayUnit {
  switch (unit) {
    case 'V':
    case 'A':
    case 'Hz':
    case 'dB':
    case 's':
      return { kind: 'si', unit };
    case 'Ω':
      return { kind: 'si', unit: 'ohm' };
    case 'V/s':
      return { kind: 'si', unit: 'V', suffix: '/s' };
    case 'fraction of range':
      return { kind: 'percent' };
    default:
      return { kind: 'plain', suffix: unit ? ` ${unit}` : '' };
  }
}

const trimNumber = (value: number) => String(Number(value.toPrecision(4)));

/**
 * A value as shown in the compare and history views.
 * @example formatValue(0.001, { kind: 'percent' }) // "0.1 %"
 */
export function formatValue(value: unknown, unit: DisplayUnit): string {
  if (value === undefined) return '—';
  if (value === null) return 'none';
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'string') return value === '' ? '(empty)' : value;
  if (typeof value !== 'number') return JSON.stringify(value);
  if (!Number.isFinite(value)) return String(value);
  switch (unit.kind) {
    case 'si':
      return `${formatQuantity(value, unit.unit, 4)}${unit.suffix ?? ''}`;
    case 'percent':
      return `${trimNumber(value * 100)} %`;
    case 'plain':
      return `${trimNumber(value)}${unit.suffix}`;
  }
}
