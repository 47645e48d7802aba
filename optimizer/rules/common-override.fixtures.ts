// Test decks of common-override shared by its rule table and its ngspice check: the Wren-8
// register slice with its data inputs tied to the rails and a pulsed clear, and the DTL reader
// the clear-line decks hang on each line.
import type { NetlistBuilder } from '../netlist/build';

/**
 * A DTL stage reading line Y inside the current instance: input diode DI from its node P (pulled
 * up by RP), two level-shift diodes to QR's base (bleed RBL), QR pulling Z (pulled up by RZ).
 * Needs the models QN (npn) and DN (diode).
 */
export function dtlReader(b: NetlistBuilder): void {
  b.resistor('RP', 'VCC', 'P', 4700);
  b.diode('DI', 'P', 'Y', { model: 'DN' });
  b.diode('DL1', 'P', 'M', { model: 'DN' });
  b.diode('DL2', 'M', 'BR', { model: 'DN' });
  b.resistor('RBL', 'BR', '0', 5000);
  b.resistor('RZ', 'VCC', 'Z', 2000);
  b.npn('QR', 'Z', 'BR', '0', { model: 'QN' });
}

/**
 * The register slice with its data inputs tied to the rails and a pulsed clear: per bit, QEN
 * inverts LD onto ENB, and the line Q is pulled up by RCQ and down by QD (data), QE (ENB) and
 * QCLR (CLR). Bits 1 and 3 have D tied high, so their lines are constant 0 and their functions no
 * longer read ENB; the enable stage still drives QE's base resistor.
 */
const DECK = `Wren-8 register slice, data tied to the rails, clear pulsed
.global VCC
VCC VCC 0 DC 3.6
VLD LD 0 PULSE(0 3.6 0 10n 10n 1u 2u)
VCLR CLR 0 PULSE(0 3.6 0 10n 10n 0.5u 4u)
.subckt BIT D Q LD CLR
RBEN LD BEN 470
RCEN VCC ENB 640
QEN ENB BEN 0 QN
RBD D BD 470
RBE ENB BE 470
RCQ VCC Q 640
QD Q BD 0 QN
QE Q BE 0 QN
RBC CLR BC 1k
QCLR Q BC 0 QN
.ends BIT
XB0 D0 Q0 LD CLR BIT
XB1 D1 Q1 LD CLR BIT
XB2 D2 Q2 LD CLR BIT
XB3 D3 Q3 LD CLR BIT
VD0 D0 0 DC 0
VD1 D1 0 DC 3.6
VD2 D2 0 DC 0
VD3 D3 0 DC 3.6
RL0 Q0 0 100k
RL1 Q1 0 100k
RL2 Q2 0 100k
RL3 Q3 0 100k
.model QN NPN (IS=1e-14 BF=100)
.end
`;

/**
 * The deck as text; without `sources` the LD and CLR pulse sources are left out, so a test (or
 * ngspice through its own sources) drives them as plain inputs.
 */
export function tiedRegister(o: { sources?: boolean } = {}): string {
  return o.sources === false ? DECK.replace(/^V(LD|CLR) .*\n/gm, '') : DECK;
}
