// Renders a laid-out drawing as SVG: one group per part (its glyph, highlighted when removed or
// added) and one group per net (its wires, junctions, rail glyphs, port stubs and label).
import { Circle, G, Line, Polyline, Rect, Text as SvgText } from 'react-native-svg';
import { useTheme } from '@/components/theme/use-theme';
import type { PartRole } from '@/optimizer/region/graph';
import type { Drawing, PlacedNet, PlacedPart, Stub } from './layout';
import { SymbolGlyph } from './symbols';

/** The last two levels of a hierarchical name: enough to tell parts apart in one region. */
export function shortName(name: string): string {
  const parts = name.split('.');
  return parts.slice(-2).join('.');
}

function usePens() {
  const { colours, fonts, sizes } = useTheme();
  const stroke = (role: PartRole) =>
    role === 'removed' ? colours.danger : role === 'added' ? colours.success : role === 'changed' ? colours.warning : colours.text;
  const halo = (role: PartRole) => (role === 'removed' ? colours.dangerSoft : role === 'added' ? colours.successSoft : role === 'changed' ? colours.warningSoft : undefined);
  return { colours, fonts, sizes, stroke, halo };
}

function PartGroup({ placed }: { placed: PlacedPart }) {
  const { colours, fonts, sizes, stroke, halo } = usePens();
  const { part, geometry, x, y } = placed;
  const ink = { stroke: stroke(part.role), fill: colours.surface, width: part.role === 'neighbour' || part.role === 'plain' ? sizes.iconStroke * 0.8 : sizes.iconStroke * 1.3, font: fonts.mono };
  const back = halo(part.role);
  const labelRight = geometry.glyph === 'resistor' || geometry.glyph === 'capacitor' || geometry.glyph === 'diode' || geometry.glyph === 'pullup' || geometry.glyph === 'pulldown';
  return (
    <G transform={`translate(${x} ${y})`} data-part={part.name} data-kind={part.kind} data-role={part.role} data-glyph={geometry.glyph}>
      {back ? <Rect x={-6} y={-6} width={geometry.width + 12} height={geometry.height + 12} rx={6} fill={back} stroke={stroke(part.role)} strokeWidth={1} strokeDasharray={part.role === 'removed' ? '4 3' : undefined} /> : null}
      <SymbolGlyph geometry={geometry} ink={ink} />
      <SvgText
        x={labelRight ? geometry.width + 4 : geometry.width / 2}
        y={labelRight ? geometry.height / 2 + 3 : -4}
        textAnchor={labelRight ? 'start' : 'middle'}
        fontSize={9}
        fontFamily={fonts.mono}
        fill={part.role === 'neighbour' ? colours.textMuted : stroke(part.role)}
      >
        {shortName(part.name)}
      </SvgText>
    </G>
  );
}

function RailGlyph({ stub, volts, name }: { stub: Stub; volts: number; name: string }) {
  const { colours, fonts, sizes } = usePens();
  const s = { stroke: colours.textMuted, strokeWidth: sizes.iconStroke * 0.8 };
  const { to } = stub;
  if (volts === 0) {
    // IEC 60617 / IEEE 315 ground: three shortening bars, always pointing down.
    return (
      <>
        <Line x1={stub.from.x} y1={stub.from.y} x2={to.x} y2={to.y} {...s} />
        <Line x1={to.x - 8} y1={to.y} x2={to.x + 8} y2={to.y} {...s} />
        <Line x1={to.x - 5} y1={to.y + 3} x2={to.x + 5} y2={to.y + 3} {...s} />
        <Line x1={to.x - 2} y1={to.y + 6} x2={to.x + 2} y2={to.y + 6} {...s} />
      </>
    );
  }
  const vertical = stub.side === 'N' || stub.side === 'S';
  return (
    <>
      <Line x1={stub.from.x} y1={stub.from.y} x2={to.x} y2={to.y} {...s} />
      {vertical ? <Line x1={to.x - 8} y1={to.y} x2={to.x + 8} y2={to.y} {...s} /> : <Line x1={to.x} y1={to.y - 8} x2={to.x} y2={to.y + 8} {...s} />}
      <SvgText x={to.x + (vertical ? 10 : 4)} y={to.y + (vertical ? 3 : -10)} fontSize={8} fontFamily={fonts.mono} fill={colours.textMuted}>
        {shortName(name)}
      </SvgText>
    </>
  );
}

function NetGroup({ placed }: { placed: PlacedNet }) {
  const { colours, fonts, sizes } = usePens();
  const { net, wires, junctions, stubs, label } = placed;
  const rail = net.railVolts !== undefined;
  return (
    <G data-net={net.name} data-rail={rail ? 'yes' : 'no'}>
      {wires.map((w, i) => (
        <Polyline key={i} points={w.map((p) => `${p.x},${p.y}`).join(' ')} fill="none" stroke={colours.textMuted} strokeWidth={sizes.iconStroke * 0.7} />
      ))}
      {junctions.map((j, i) => (
        <Circle key={i} cx={j.x} cy={j.y} r={2.5} fill={colours.textMuted} />
      ))}
      {rail
        ? stubs.map((s, i) => <RailGlyph key={i} stub={s} volts={net.railVolts!} name={net.name} />)
        : stubs.map((s, i) => (
            <G key={i}>
              <Line x1={s.from.x} y1={s.from.y} x2={s.to.x} y2={s.to.y} stroke={colours.textMuted} strokeWidth={sizes.iconStroke * 0.7} />
              {net.boundary ? <Circle cx={s.to.x} cy={s.to.y} r={2.5} fill={colours.surface} stroke={colours.accent} strokeWidth={1} /> : null}
            </G>
          ))}
      {rail ? null : (
        <SvgText x={label.x + 4} y={label.y - 4} fontSize={8} fontFamily={fonts.mono} fill={net.boundary ? colours.accent : colours.textFaint}>
          {shortName(net.name)}
        </SvgText>
      )}
    </G>
  );
}

/** The whole drawing in its own coordinates; the viewport decides which part is visible. */
export function SchematicContent({ drawing }: { drawing: Drawing }) {
  return (
    <G>
      {drawing.nets.map((n) => (
        <NetGroup key={n.net.name} placed={n} />
      ))}
      {drawing.parts.map((p) => (
        <PartGroup key={p.part.name} placed={p} />
      ))}
    </G>
  );
}
