// Schematic glyphs in their own coordinates (see symbol-geometry): IEEE 315 / IEC 60617 transistors,
// zig-zag resistors, capacitors, diodes and sources; IEEE 91 distinctive-shape gates.
import { Circle, Line, Path, Polygon, Rect, Text as SvgText } from 'react-native-svg';
import type { Glyph, SymbolGeometry } from './symbol-geometry';

type Ink = { stroke: string; fill: string; width: number; font: string };

/** Arrowhead polygon points with its tip at (tx,ty) pointing along (dx,dy). */
function arrow(tx: number, ty: number, dx: number, dy: number, size = 6): string {
  const l = Math.hypot(dx, dy);
  const ux = dx / l;
  const uy = dy / l;
  const bx = tx - ux * size;
  const by = ty - uy * size;
  return `${tx},${ty} ${bx - uy * size * 0.5},${by + ux * size * 0.5} ${bx + uy * size * 0.5},${by - ux * size * 0.5}`;
}

function bjt(pnp: boolean, geo: SymbolGeometry, ink: Ink) {
  const s = { stroke: ink.stroke, strokeWidth: ink.width, fill: 'none' } as const;
  return (
    <>
      <Circle cx={22} cy={25} r={17} {...s} />
      <Line x1={0} y1={25} x2={14} y2={25} {...s} />
      <Line x1={14} y1={14} x2={14} y2={36} {...s} strokeWidth={ink.width * 1.6} />
      <Path d="M14 20 L30 11 L30 0" {...s} />
      <Path d="M14 30 L30 39 L30 50" {...s} />
      {pnp ? <Polygon points={arrow(16, 31, -16, -9)} fill={ink.stroke} /> : <Polygon points={arrow(29, 38.5, 16, 9)} fill={ink.stroke} />}
      {geo.pins.length > 3 ? <Line x1={36} y1={25} x2={40} y2={25} {...s} /> : null}
    </>
  );
}

function mos(p: boolean, geo: SymbolGeometry, ink: Ink) {
  const s = { stroke: ink.stroke, strokeWidth: ink.width, fill: 'none' } as const;
  const bulk = geo.pins.length > 3;
  return (
    <>
      <Line x1={0} y1={25} x2={p ? 4 : 10} y2={25} {...s} />
      {p ? <Circle cx={7} cy={25} r={3} {...s} /> : null}
      <Line x1={10} y1={14} x2={10} y2={36} {...s} />
      {/* enhancement mode: a broken channel */}
      <Line x1={16} y1={10} x2={16} y2={18} {...s} strokeWidth={ink.width * 1.6} />
      <Line x1={16} y1={21} x2={16} y2={29} {...s} strokeWidth={ink.width * 1.6} />
      <Line x1={16} y1={32} x2={16} y2={40} {...s} strokeWidth={ink.width * 1.6} />
      <Path d="M16 14 L30 14 L30 0" {...s} />
      <Path d="M16 36 L30 36 L30 50" {...s} />
      <Line x1={16} y1={25} x2={bulk ? 40 : 30} y2={25} {...s} />
      {bulk ? null : <Line x1={30} y1={25} x2={30} y2={36} {...s} />}
      {p ? <Polygon points={arrow(28, 25, 1, 0)} fill={ink.stroke} /> : <Polygon points={arrow(17, 25, -1, 0)} fill={ink.stroke} />}
    </>
  );
}

function gateBody(glyph: Glyph, geo: SymbolGeometry, ink: Ink) {
  const s = { stroke: ink.stroke, strokeWidth: ink.width, fill: ink.fill } as const;
  const H = geo.height;
  const mid = H / 2;
  const ry = (H - 4) / 2;
  const bubble = (cx: number, cy: number) => <Circle cx={cx} cy={cy} r={3.5} {...s} />;
  const leads = geo.pins
    .filter((p) => p.side === 'W')
    .map((p) => <Line key={p.name} x1={0} y1={p.y} x2={glyph === 'or' || glyph === 'nor' || glyph === 'xor' || glyph === 'xnor' ? 14 : 10} y2={p.y} stroke={ink.stroke} strokeWidth={ink.width} />);
  const inverted = glyph === 'nand' || glyph === 'nor' || glyph === 'xnor' || glyph === 'not' || glyph === 'notif';
  const outFrom = inverted ? 55 : 48;
  const out = <Line x1={outFrom} y1={mid} x2={60} y2={mid} stroke={ink.stroke} strokeWidth={ink.width} />;
  switch (glyph) {
    case 'and':
    case 'nand':
      return (
        <>
          {leads}
          <Path d={`M10 2 H30 A18 ${ry} 0 0 1 30 ${H - 2} H10 Z`} {...s} />
          {glyph === 'nand' ? bubble(51.5, mid) : null}
          {out}
        </>
      );
    case 'or':
    case 'nor':
    case 'xor':
    case 'xnor':
      return (
        <>
          {leads}
          {glyph === 'xor' || glyph === 'xnor' ? <Path d={`M5 2 Q17 ${mid} 5 ${H - 2}`} stroke={ink.stroke} strokeWidth={ink.width} fill="none" /> : null}
          <Path d={`M10 2 Q22 ${mid} 10 ${H - 2} Q34 ${H - 2} 48 ${mid} Q34 2 10 2 Z`} {...s} />
          {glyph === 'nor' || glyph === 'xnor' ? bubble(51.5, mid) : null}
          {out}
        </>
      );
    case 'not':
    case 'buf':
    case 'bufif':
    case 'notif': {
      const en = geo.pins.find((p) => p.name === 'en');
      return (
        <>
          {leads}
          <Path d={`M12 ${mid - 14} L44 ${mid} L12 ${mid + 14} Z`} {...s} />
          {inverted ? bubble(47.5, mid) : null}
          <Line x1={inverted ? 51 : 44} y1={mid} x2={60} y2={mid} stroke={ink.stroke} strokeWidth={ink.width} />
          {en ? <Line x1={en.x} y1={0} x2={en.x} y2={mid - 8.5} stroke={ink.stroke} strokeWidth={ink.width} /> : null}
        </>
      );
    }
    case 'latch':
    case 'dff':
      return (
        <>
          {leads}
          <Rect x={10} y={2} width={40} height={H - 4} {...s} />
          <SvgText x={14} y={15} fontSize={9} fontFamily={ink.font} fill={ink.stroke}>D</SvgText>
          <SvgText x={glyph === 'dff' ? 20 : 14} y={31} fontSize={9} fontFamily={ink.font} fill={ink.stroke}>{glyph === 'dff' ? 'C1' : 'EN'}</SvgText>
          {glyph === 'dff' ? <Path d="M10 24 L16 28 L10 32" stroke={ink.stroke} strokeWidth={ink.width} fill="none" /> : null}
          <SvgText x={38} y={15} fontSize={9} fontFamily={ink.font} fill={ink.stroke}>Q</SvgText>
          <Line x1={50} y1={12} x2={60} y2={12} stroke={ink.stroke} strokeWidth={ink.width} />
        </>
      );
    default:
      return null;
  }
}

/** The glyph of one part, drawn in the part's own box (the caller translates it). */
export function SymbolGlyph({ geometry, ink }: { geometry: SymbolGeometry; ink: Ink }) {
  const s = { stroke: ink.stroke, strokeWidth: ink.width, fill: 'none' } as const;
  const g = geometry.glyph;
  switch (g) {
    case 'npn':
    case 'pnp':
      return bjt(g === 'pnp', geometry, ink);
    case 'nmos':
    case 'pmos':
      return mos(g === 'pmos', geometry, ink);
    case 'resistor':
      return <Path d="M10 0 V10 L16 12.5 L4 17.5 L16 22.5 L4 27.5 L16 32.5 L4 37.5 L10 40 V50" {...s} />;
    case 'capacitor':
      return <Path d="M12 0 V17 M2 17 H22 M2 23 H22 M12 23 V40" {...s} />;
    case 'diode':
      return (
        <>
          <Path d="M12 0 V12 M12 28 V40 M4 28 H20" {...s} />
          <Polygon points="4,12 20,12 12,28" fill={ink.fill} stroke={ink.stroke} strokeWidth={ink.width} />
        </>
      );
    case 'vsource':
      return <Path d="M15 0 V13 M15 37 V50 M15 17 V23 M12 20 H18 M12 30 H18 M27 25 A12 12 0 1 1 3 25 A12 12 0 1 1 27 25" {...s} />;
    case 'isource':
      return (
        <>
          <Path d="M15 0 V13 M15 37 V50 M15 32 V19 M27 25 A12 12 0 1 1 3 25 A12 12 0 1 1 27 25" {...s} />
          <Polygon points={arrow(15, 17, 0, -1)} fill={ink.stroke} />
        </>
      );
    case 'pullup':
    case 'pulldown': {
      const up = g === 'pullup';
      return <Path d={up ? 'M4 2 H16 M10 2 V8 L15 11 L5 17 L15 23 L5 29 L10 32 V40' : 'M10 0 V8 L15 11 L5 17 L15 23 L5 29 L10 32 V38 M4 38 H16'} {...s} />;
    }
    default:
      return gateBody(g, geometry, ink);
  }
}

export type { Ink };
