import { CartesianGrid, ComposedChart, Line, ReferenceLine, Tooltip, XAxis, YAxis } from 'recharts';
import { niceStep, niceTicks, tickRoom } from './nice-ticks';
import { CHART_HEIGHT, PALETTE, type Point } from './spectrum-look';

const MARGIN = { top: 12, right: 16, bottom: 30, left: 22 };
const Y_AXIS_WIDTH = 52;
/** Widest tick label in px at 12 px type ("1000", "−2.5"), for the room between ticks. */
const X_LABEL_PX = 30;
/** A tick label's height with the space it needs above and below, so the flux axis keeps about six ticks. */
const Y_LABEL_PX = 24;

const SUPERSCRIPT = '⁰¹²³⁴⁵⁶⁷⁸⁹';
const superscript = (n: number) => `${n < 0 ? '⁻' : ''}${String(Math.abs(n)).split('').map((d) => SUPERSCRIPT[Number(d)]).join('')}`;
const minus = (text: string) => text.replace('-', '−');

/**
 * The flux axis: round ticks from zero (or the lowest point) to past the
 * highest, and one power of ten taken out into the axis title when the
 * numbers are very large or small, so a label never outgrows its room.
 */
function fluxAxis(data: readonly Point[], plotHeight: number) {
  let low = 0;
  let high = 0;
  for (const d of data) {
    low = Math.min(low, d.flux, d.fit ?? 0);
    high = Math.max(high, d.flux, d.fit ?? 0);
  }
  if (!(high > low)) high = low + 1;
  const biggest = Math.max(Math.abs(low), Math.abs(high));
  const exponent = biggest >= 1e4 || biggest < 1e-2 ? Math.floor(Math.log10(biggest)) : 0;
  const scale = Math.pow(10, exponent);
  const room = tickRoom(plotHeight, Y_LABEL_PX);
  const step = niceStep((high - low) / scale / room) * scale;
  const lo = Math.floor(low / step) * step;
  const hi = Math.ceil(high / step) * step;
  const { ticks } = niceTicks(lo / scale, hi / scale, room + 1);
  const decimals = Math.max(0, -Math.floor(Math.log10(step / scale) + 1e-9));
  return {
    domain: [lo, hi] as [number, number],
    ticks: ticks.map((t) => t * scale),
    format: (v: number) => minus((v / scale).toFixed(decimals)),
    title: exponent === 0 ? 'Flux (as sent)' : `Flux (as sent, × 10${superscript(exponent)})`,
  };
}

/** The plot itself, at the measured width, with ticks chosen for that width. */
export default function SpectrumPlot({
  data,
  width,
  first,
  last,
  peakNm,
  peakText,
  hasFit,
}: {
  data: Point[];
  width: number;
  first: number;
  last: number;
  peakNm: number | null;
  peakText: string | null;
  hasFit: boolean;
}) {
  const plotWidth = width - MARGIN.left - MARGIN.right - Y_AXIS_WIDTH;
  const plotHeight = CHART_HEIGHT - MARGIN.top - MARGIN.bottom;
  const xTicks = niceTicks(first, last, tickRoom(plotWidth, X_LABEL_PX)).ticks;
  const y = fluxAxis(data, plotHeight);
  const dense = data.length > 400;
  return (
    <ComposedChart width={width} height={CHART_HEIGHT} data={data} margin={MARGIN}>
      <CartesianGrid stroke={PALETTE.grid} strokeDasharray="2 4" horizontalValues={y.ticks} verticalValues={xTicks} />
      <XAxis
        dataKey="nm"
        type="number"
        domain={[first, last]}
        ticks={xTicks}
        interval={0}
        allowDataOverflow
        tickFormatter={(v: number) => String(v)}
        stroke={PALETTE.axis}
        tick={{ fill: PALETTE.text, fontSize: 12 }}
        label={{ value: 'Wavelength (nm)', position: 'insideBottom', offset: -18, fill: PALETTE.text, fontSize: 12 }}
      />
      <YAxis
        type="number"
        domain={y.domain}
        ticks={y.ticks}
        interval={0}
        tickFormatter={y.format}
        stroke={PALETTE.axis}
        tick={{ fill: PALETTE.text, fontSize: 12 }}
        width={Y_AXIS_WIDTH}
        label={{ value: y.title, angle: -90, position: 'left', offset: 6, fill: PALETTE.text, fontSize: 12, style: { textAnchor: 'middle' } }}
      />
      <Tooltip
        formatter={(value, name) => [typeof value === 'number' ? value.toPrecision(4) : String(value), name]}
        labelFormatter={(label) => `${Number(label).toFixed(1)} nm`}
        contentStyle={{ background: 'var(--sl-paper)', borderColor: 'var(--sl-rule)', color: 'var(--sl-ink)' }}
      />
      <Line
        type="linear"
        dataKey="flux"
        name="Spectrum as sent"
        stroke="none"
        dot={{ r: dense ? 1.2 : 1.8, fill: PALETTE.points, fillOpacity: PALETTE.pointsOpacity, stroke: 'none' }}
        activeDot={{ r: 3, fill: PALETTE.points, stroke: PALETTE.halo }}
        isAnimationActive={false}
      />
      {hasFit ? (
        <Line type="monotone" dataKey="fit" stroke={PALETTE.halo} strokeWidth={7} dot={false} activeDot={false} tooltipType="none" isAnimationActive={false} />
      ) : null}
      {hasFit ? (
        <Line type="monotone" dataKey="fit" name="Planck fit" stroke={PALETTE.fit} strokeWidth={3} dot={false} isAnimationActive={false} />
      ) : null}
      {peakNm !== null ? (
        <ReferenceLine
          x={peakNm}
          stroke={PALETTE.peak}
          strokeWidth={1.5}
          strokeDasharray="3 2"
          // The label sits on the side of the line with more room, so it is never cut at the plot's edge.
          label={{
            value: `Peak ${peakText ?? ''}`,
            position: peakNm - first < last - peakNm ? 'insideBottomLeft' : 'insideBottomRight',
            fill: PALETTE.text,
            fontSize: 12,
          }}
        />
      ) : null}
    </ComposedChart>
  );
}

