// The product's words for proposal and scan states, and the badge tone each one gets. Every
// screen names states through these tables so a state reads the same everywhere.
import type { BadgeTone } from '@/components/ui/badge';
import type { ProposalStatus, ProposalSummary, Savings } from '@/shared/api/proposals';
import type { ScanStatus } from '@/shared/api/scans';

type Word = { label: string; tone: BadgeTone };

export const STATUS_WORDS: Record<ProposalStatus, Word> = {
  open: { label: 'Open', tone: 'accent' },
  accepted: { label: 'Accepted', tone: 'success' },
  rejected: { label: 'Rejected', tone: 'danger' },
  'out-of-date': { label: 'Out of date', tone: 'warning' },
  applied: { label: 'Applied', tone: 'neutral' },
};

export const VERDICT_WORDS: Record<ProposalSummary['verdict'], Word> = {
  proved: { label: 'Proved', tone: 'success' },
  refuted: { label: 'Refuted', tone: 'danger' },
  unverified: { label: 'Unverified', tone: 'warning' },
};

export const MARGIN_WORDS: Record<ProposalSummary['marginStatus'], Word> = {
  pass: { label: 'Margins pass', tone: 'success' },
  warn: { label: 'Margins warn', tone: 'warning' },
  fail: { label: 'Margins fail', tone: 'danger' },
};

export const READINESS_WORDS: Record<ProposalSummary['readiness'], Word> = {
  ready: { label: 'Ready', tone: 'success' },
  'failing-margins': { label: 'Failing margins', tone: 'danger' },
  refuted: { label: 'Refuted', tone: 'danger' },
  unverified: { label: 'Unverified', tone: 'warning' },
};

export const SCAN_WORDS: Record<ScanStatus, Word & { sentence: string }> = {
  queued: { label: 'Waiting', tone: 'neutral', sentence: 'Waiting for a worker to pick the scan up.' },
  running: { label: 'Scanning', tone: 'accent', sentence: 'Scanning.' },
  done: { label: 'Finished', tone: 'success', sentence: 'Scan finished.' },
  failed: { label: 'Failed', tone: 'danger', sentence: 'The scan failed.' },
  cancelled: { label: 'Cancelled', tone: 'neutral', sentence: 'The scan was cancelled.' },
};

// The engine's stage names ("parse", "rule tristate-slim", …) as a person reads them.
export function stageLabel(stage: string): string {
  const rule = /^rule[\s:]+(.+)$/.exec(stage);
  if (rule) return `Checking rule ${rule[1]}`;
  const known: Record<string, string> = {
    queued: 'Queued',
    parse: 'Reading the netlist',
    flatten: 'Flattening the hierarchy',
    extract: 'Finding the logic',
    verify: 'Proving equivalence',
    margins: 'Checking margins',
    store: 'Saving proposals',
    done: 'Finished',
  };
  return known[stage] ?? stage.charAt(0).toUpperCase() + stage.slice(1);
}

const PART_WORDS: readonly [keyof Savings, string, string][] = [
  ['transistors', 'transistor', 'transistors'],
  ['resistors', 'resistor', 'resistors'],
  ['diodes', 'diode', 'diodes'],
  ['capacitors', 'capacitor', 'capacitors'],
  ['gates', 'gate', 'gates'],
];

/** "3 transistors, 1 resistor" — the kinds a proposal saves (negative = adds), zero kinds left out. */
export function savingsPhrase(savings: Savings): string {
  const parts = PART_WORDS.filter(([k]) => savings[k] !== 0).map(([k, one, many]) => {
    const n = savings[k];
    const count = Math.abs(n);
    return `${n < 0 ? '+' : ''}${count} ${count === 1 ? one : many}${n < 0 ? ' added' : ''}`;
  });
  return parts.length ? parts.join(', ') : 'no parts';
}

/** A signed part change for a delta column: "−3", "+1", "0". */
export function signed(n: number): string {
  if (n === 0) return '0';
  return n > 0 ? `+${n}` : `−${Math.abs(n)}`;
}

export function ruleLabel(ruleId: string): string {
  const s = ruleId.replace(/-/g, ' ');
  return s.charAt(0).toUpperCase() + s.slice(1);
}
