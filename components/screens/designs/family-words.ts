// How each logic family is named on screen.
import type { DesignFamily } from '@/shared/api/designs';

export const FAMILY_WORDS: Record<DesignFamily, string> = {
  rtl: 'RTL',
  dtl: 'DTL',
  cmos: 'CMOS',
  nmos: 'NMOS',
  gate: 'Gate level',
};
