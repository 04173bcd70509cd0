import { useEffect, useRef, useState } from 'react';
// Only the type here: uPlot touches matchMedia when it loads, so the module is loaded where a canvas can be drawn.
import type uPlot from 'uplot';
import type { SensorTimeline } from '../../../domain/sensors/timeline';
import { Button } from '../../../components/ui/Button';
import { formatT } from './format';

export interface PlotSeries {
  label: string;
  unit: string;
  values: (number | null)[];
  low: number | null;
  high: number | null;
  /** Index into the palette, so a channel keeps its colour and dash when others are hidden. */
  style: number;
}

const PALETTE = ['--hf-ink', '--hf-focus', '--hf-go', '--hf-caution', '--hf-link', '--hf-danger'];
const DASHES: number[][] = [[], [10, 4], [3, 3], [14, 4, 3, 4], [6, 2], [2, 6]];

export function seriesLook(style: number): { colorVar: string; dash: number[] } {
  return { colorVar: PALETTE[style % PALETTE.length]!, dash: DASHES[(style + Math.floor(style / PALETTE.length)) % DASHES.length]! };
}

/** jsdom (the client tests) has no canvas; the plot is then left out and the text table stands alone. */
function canDraw(): boolean {
  if (typeof navigator !== 'undefined' && /jsdom/i.test(navigator.userAgent)) return false;
  return typeof window.matchMedia === 'function' && typeof ResizeObserver === 'function';
}

function cssVar(name: string): string {
  return getComputedStyle(document.documentElement).getPropertyValue(name).trim() || '#000';
}

function withAlpha(color: string, alpha: number): string {
  const m = /^#([0-9a-f]{6})$/i.exec(color);
  if (!m) return color;
  const n = parseInt(m[1]!, 16);
  return `rgba(${(n >> 16) & 255}, ${(n >> 8) & 255}, ${n & 255}, ${alpha})`;
}

const unitScale = (unit: string) => `u:${unit || '(none)'}`;

/** The count's T-0, holds and redline readings, and each channel's limit lines, drawn over the data. */
function overlayPlugin(timeline: SensorTimeline, series: PlotSeries[]): uPlot.Plugin {
  const look = () => ({ ink: cssVar('--hf-ink'), danger: cssVar('--hf-danger'), caution: cssVar('--hf-caution') });
  return {
    hooks: {
      drawClear: [
        (u) => {
          const { ctx, bbox } = u;
          const c = look();
          ctx.save();
          ctx.fillStyle = withAlpha(c.caution, 0.18);
          for (const h of timeline.holds) {
            const x0 = Math.max(bbox.left, u.valToPos(h.fromT, 'x', true));
            const x1 = Math.min(bbox.left + bbox.width, u.valToPos(h.toT, 'x', true));
            if (x1 > x0) ctx.fillRect(x0, bbox.top, x1 - x0, bbox.height);
          }
          ctx.restore();
        },
      ],
      draw: [
        (u) => {
          const { ctx, bbox } = u;
          const c = look();
          const px = devicePixelRatio || 1;
          const inX = (x: number) => x >= bbox.left && x <= bbox.left + bbox.width;
          ctx.save();
          ctx.font = `${12 * px}px sans-serif`;
          ctx.textBaseline = 'top';
          // Limit lines: dashed, in the danger colour, on their channel's scale.
          ctx.strokeStyle = c.danger;
          ctx.fillStyle = c.danger;
          ctx.lineWidth = 1.5 * px;
          ctx.setLineDash([6 * px, 4 * px]);
          // Labels already written, so two limits close together do not print over each other: a label that would
          // meet one moves right along its line, past it.
          const placed: { y: number; x0: number; x1: number }[] = [];
          const lineHeight = 14 * px;
          for (const s of series) {
            for (const [value, word] of [
              [s.low, 'low'],
              [s.high, 'high'],
            ] as const) {
              if (value === null) continue;
              const y = u.valToPos(value, unitScale(s.unit), true);
              if (y < bbox.top || y > bbox.top + bbox.height) continue;
              ctx.beginPath();
              ctx.moveTo(bbox.left, y);
              ctx.lineTo(bbox.left + bbox.width, y);
              ctx.stroke();
              const text = `${s.label} ${word} ${value} ${s.unit}`.trim();
              const width = ctx.measureText(text).width;
              let x = bbox.left + 4 * px;
              for (let moved = true; moved; ) {
                moved = false;
                for (const p of placed) {
                  if (Math.abs(p.y - y) < lineHeight && x < p.x1 && x + width > p.x0) {
                    x = p.x1 + 12 * px;
                    moved = true;
                  }
                }
              }
              placed.push({ y, x0: x, x1: x + width });
              ctx.fillText(text, x, y + 2 * px);
            }
          }
          // Redline readings from the count log: a dotted line and a diamond at the top.
          ctx.setLineDash([2 * px, 3 * px]);
          for (const r of timeline.redlines) {
            const x = u.valToPos(r.t, 'x', true);
            if (!inX(x)) continue;
            ctx.beginPath();
            ctx.moveTo(x, bbox.top);
            ctx.lineTo(x, bbox.top + bbox.height);
            ctx.stroke();
            ctx.beginPath();
            ctx.moveTo(x, bbox.top);
            ctx.lineTo(x + 6 * px, bbox.top + 6 * px);
            ctx.lineTo(x, bbox.top + 12 * px);
            ctx.lineTo(x - 6 * px, bbox.top + 6 * px);
            ctx.closePath();
            ctx.fill();
          }
          // T-0: a solid line on the canvas and a text label in the page (kept where the line is).
          const x0 = u.valToPos(0, 'x', true);
          const label = u.over.querySelector<HTMLElement>('.hf-t0-label');
          if (label) {
            const css = u.valToPos(0, 'x');
            label.hidden = !(css >= 0 && css <= u.over.clientWidth);
            label.style.left = `${css + 4}px`;
          }
          if (inX(x0)) {
            ctx.setLineDash([]);
            ctx.strokeStyle = c.ink;
            ctx.fillStyle = c.ink;
            ctx.lineWidth = 2 * px;
            ctx.beginPath();
            ctx.moveTo(x0, bbox.top);
            ctx.lineTo(x0, bbox.top + bbox.height);
            ctx.stroke();
          }
          ctx.restore();
        },
      ],
    },
  };
}

/**
 * The channels against seconds from T-0, drawn with uPlot on a canvas: drag across the plot to zoom in, the buttons
 * to pan, zoom and reset. The canvas is one image to assistive technology; the table beside it carries the numbers.
 */
export function SensorPlot({
  t,
  series,
  timeline,
  label,
  full,
  onView,
}: {
  t: number[];
  series: PlotSeries[];
  timeline: SensorTimeline;
  label: string;
  /** The dataset's whole time range: what Reset view returns to. */
  full: [number, number];
  /** Called with the shown stretch after a zoom or pan, and null when the whole range is shown again. */
  onView?: (view: [number, number] | null) => void;
}) {
  const holder = useRef<HTMLDivElement>(null);
  const plot = useRef<uPlot | null>(null);
  const [theme, setTheme] = useState(() => (typeof document === 'undefined' ? '' : (document.documentElement.dataset.theme ?? '')));
  const [drawable] = useState(canDraw);
  // The data and the callbacks change without the plot being made again: new points go in with setData.
  const latest = useRef({ t, series, full, onView });
  latest.current = { t, series, full, onView };
  const shown = useRef<[number, number] | null>(null);
  const shape = JSON.stringify(series.map((s) => [s.label, s.unit, s.low, s.high, s.style]));

  // Colours come from the theme's CSS variables, so the plot is drawn again when the theme changes.
  useEffect(() => {
    const observer = new MutationObserver(() => setTheme(document.documentElement.dataset.theme ?? ''));
    observer.observe(document.documentElement, { attributes: true, attributeFilter: ['data-theme'] });
    return () => observer.disconnect();
  }, []);

  useEffect(() => {
    const el = holder.current;
    const { t, series } = latest.current;
    if (!drawable || !el || t.length < 2) return;
    const width = Math.max(200, el.clientWidth);
    const units = [...new Set(series.map((s) => s.unit))];
    const ink = cssVar('--hf-ink');
    const grid = cssVar('--hf-line-soft');
    const scales: uPlot.Scales = { x: { time: false } };
    for (const unit of units) {
      // Each unit gets its own scale, wide enough to show its limit lines.
      const limits = series.filter((s) => s.unit === unit).flatMap((s) => [s.low, s.high].filter((v): v is number => v !== null));
      scales[unitScale(unit)] = {
        range: (_u, min, max) => {
          const lo = Math.min(min ?? 0, ...limits);
          const hi = Math.max(max ?? 1, ...limits);
          const pad = (hi - lo) * 0.05 || 1;
          return [lo - pad, hi + pad];
        },
      };
    }
    const axisFont = '12px sans-serif';
    const opts: uPlot.Options = {
      width,
      height: width < 500 ? 260 : 340,
      legend: { show: false },
      cursor: { drag: { x: true, y: false, setScale: true } },
      scales,
      axes: [
        { stroke: ink, grid: { stroke: grid, width: 1 }, ticks: { stroke: grid }, font: axisFont, values: (_u, splits) => splits.map((v) => (v === 0 ? 'T-0' : v < 0 ? `T${v}` : `T+${v}`)) },
        ...units.map((unit, i) => ({
          scale: unitScale(unit),
          side: i % 2 === 0 ? 3 : 1,
          stroke: ink,
          grid: { show: i === 0, stroke: grid, width: 1 },
          ticks: { stroke: grid },
          font: axisFont,
          label: unit || undefined,
          labelFont: axisFont,
          size: 56,
        })),
      ],
      series: [
        {},
        ...series.map((s) => {
          const l = seriesLook(s.style);
          return { label: s.label, scale: unitScale(s.unit), stroke: cssVar(l.colorVar), dash: l.dash, width: 1.5, points: { show: false }, spanGaps: false };
        }),
      ],
      plugins: [overlayPlugin(timeline, series)],
      hooks: {
        setScale: [
          (u, key) => {
            if (key !== 'x') return;
            const { full, onView } = latest.current;
            const min = u.scales.x!.min ?? full[0];
            const max = u.scales.x!.max ?? full[1];
            const whole = min <= full[0] + 1e-9 && max >= full[1] - 1e-9;
            shown.current = whole ? null : [min, max];
            onView?.(shown.current);
          },
        ],
      },
    };
    let u: uPlot | null = null;
    let resize: ResizeObserver | null = null;
    let gone = false;
    void import('uplot').then(({ default: UPlot }) => {
      if (gone) return;
      const now = latest.current;
      const made = new UPlot(opts, [now.t, ...now.series.map((s) => s.values)] as uPlot.AlignedData, el);
      const t0 = document.createElement('span');
      t0.className = 'hf-t0-label';
      t0.textContent = 'T-0';
      made.over.appendChild(t0);
      // A plot made again (another channel, the other theme) keeps the stretch that was shown.
      if (shown.current) made.setScale('x', { min: shown.current[0], max: shown.current[1] });
      else made.redraw(false, false);
      u = made;
      plot.current = made;
      resize = new ResizeObserver(() => {
        const w = Math.max(200, el.clientWidth);
        if (Math.abs(w - made.width) > 2) made.setSize({ width: w, height: w < 500 ? 260 : 340 });
      });
      resize.observe(el);
    });
    return () => {
      gone = true;
      resize?.disconnect();
      u?.destroy();
      plot.current = null;
    };
  }, [drawable, shape, timeline, theme]);

  useEffect(() => {
    plot.current?.setData([t, ...series.map((s) => s.values)] as uPlot.AlignedData, false);
  }, [t, series]);

  function setX(min: number, max: number) {
    const u = plot.current;
    if (!u) return;
    const span = max - min;
    const lo = Math.max(full[0], Math.min(min, full[1] - span));
    u.setScale('x', { min: lo, max: Math.min(full[1], lo + span) });
  }
  function view(): [number, number] {
    const x = plot.current?.scales.x;
    return [x?.min ?? full[0], x?.max ?? full[1]];
  }
  const pan = (fraction: number) => {
    const [a, b] = view();
    const d = (b - a) * fraction;
    setX(a + d, b + d);
  };
  const zoom = (factor: number) => {
    const [a, b] = view();
    const mid = (a + b) / 2;
    const half = Math.min((full[1] - full[0]) / 2, ((b - a) / 2) * factor);
    setX(mid - half, mid + half);
  };

  return (
    <div className="flex min-w-0 flex-col gap-2">
      <div className="flex flex-wrap gap-2" role="group" aria-label="Plot view">
        <Button onClick={() => pan(-0.5)}>Earlier</Button>
        <Button onClick={() => pan(0.5)}>Later</Button>
        <Button onClick={() => zoom(0.5)}>Zoom in</Button>
        <Button onClick={() => zoom(2)}>Zoom out</Button>
        <Button onClick={() => setX(full[0], full[1])}>Reset view</Button>
      </div>
      <p className="text-sm text-ink-muted">
        Drag across the plot to zoom into a stretch of time. Shaded bands are the count’s holds; the solid line is T-0 ({formatT(0)}); dashed lines are limits;
        diamonds are out-of-limits readings from the count log.
      </p>
      <div ref={holder} role="img" aria-label={label} className="hf-sensor-plot w-full min-w-0 overflow-hidden rounded-md border-2 border-line bg-surface">
        {drawable ? null : <p className="p-3 text-sm">The plot cannot be drawn here; the table below lists the same readings in words.</p>}
      </div>
    </div>
  );
}
