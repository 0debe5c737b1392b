import { useEffect, useMemo, useRef, useState, type MouseEvent, type ReactNode } from 'react';
import type { HrStar } from '@shared/schemas/hr';
import { formatResult } from '@shared/physics/display';
import { useTheme } from '@/lib/theme';
import { paintCanvas } from './hr-paint';
import { buildScene, type Palette, type PlotStar, type Scene } from './hr-scene';
import { buildPointIndex } from './point-index';

/** The theme's colours as the stylesheet sets them, so the canvas follows the day and night themes. */
export function readPalette(theme: 'day' | 'night'): Palette {
  const css = getComputedStyle(document.documentElement);
  const v = (name: string, fallback: string) => css.getPropertyValue(name).trim() || fallback;
  return {
    paper: v('--sl-paper', '#f5eedc'),
    ink: v('--sl-ink', '#1b2d52'),
    inkSoft: v('--sl-ink-soft', '#4a5677'),
    rule: v('--sl-rule', '#c8b68a'),
    accent: v('--sl-brass', '#7a5718'),
    redOnly: theme === 'night',
  };
}

/** How near (CSS px) the pointer must come to a star for the star to answer. */
const HOVER_REACH_PX = 8;

export function starValues(star: HrStar): { temperature: string; luminosity: string } {
  return {
    temperature: formatResult({ quantity: 'temperature', value: star.temperature.value, uncertainty: star.temperature.sigma }).values[0].text,
    luminosity: formatResult({ quantity: 'luminosity', value: star.luminosity.value, uncertainty: star.luminosity.sigma }).values[0].text,
  };
}

/**
 * The diagram on a canvas, with a tooltip for the star under the pointer and
 * a click through to its sheet. The scene is handed up so the page can save
 * the same drawing as SVG.
 */
export function HrPlot({
  stars,
  highlightTag,
  label,
  onOpen,
  onScene,
  fixedHeight,
  children,
}: {
  stars: HrStar[];
  highlightTag: string | null;
  label: string;
  onOpen: (star: HrStar) => void;
  onScene?: (scene: Scene, palette: Palette, canvas: HTMLCanvasElement) => void;
  /** A set height in CSS px (the target sheet's small diagram); otherwise the height follows the width. */
  fixedHeight?: number;
  /** Drawn over the canvas in the same CSS pixels (a marked star). */
  children?: ReactNode;
}) {
  const { theme } = useTheme();
  const box = useRef<HTMLDivElement>(null);
  const canvas = useRef<HTMLCanvasElement>(null);
  const [width, setWidth] = useState(0);
  const [hovered, setHovered] = useState<PlotStar | null>(null);
  const firstDrawn = useRef(false);

  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const observer = new ResizeObserver((entries) => setWidth(Math.floor(entries[0].contentRect.width)));
    observer.observe(el);
    return () => observer.disconnect();
  }, []);

  const height = fixedHeight ?? Math.round(Math.min(680, Math.max(340, width * 0.68)));
  const palette = useMemo(() => (width > 0 ? readPalette(theme) : null), [theme, width]);
  const scene = useMemo(
    () => (palette && width > 0 ? buildScene(stars, { width, height }, palette, highlightTag) : null),
    [stars, width, height, palette, highlightTag],
  );
  const index = useMemo(() => (scene ? buildPointIndex(scene.stars) : null), [scene]);

  useEffect(() => {
    const el = canvas.current;
    if (!el || !scene || !palette) return;
    const ratio = window.devicePixelRatio || 1;
    el.width = Math.round(scene.frame.width * ratio);
    el.height = Math.round(scene.frame.height * ratio);
    const ctx = el.getContext('2d');
    if (!ctx) return;
    ctx.setTransform(ratio, 0, 0, ratio, 0, 0);
    paintCanvas(ctx, scene, palette);
    onScene?.(scene, palette, el);
    if (!firstDrawn.current && scene.stars.length > 0) {
      firstDrawn.current = true;
      // Read by `npm run bench:hr` and the browser test: when the stars were first on screen, and where one of them is.
      const first = scene.stars[0];
      performance.mark('hr:first-draw', { detail: { x: first.x, y: first.y, designation: first.star.designation, count: scene.stars.length } });
    }
  }, [scene, palette, onScene]);

  const pick = (event: MouseEvent<HTMLCanvasElement>) => {
    const rect = event.currentTarget.getBoundingClientRect();
    return index?.nearest(event.clientX - rect.left, event.clientY - rect.top, HOVER_REACH_PX) ?? null;
  };

  const values = hovered ? starValues(hovered.star) : null;
  const tipLeft = hovered && scene ? Math.min(hovered.x + 12, scene.frame.width - 230) : 0;
  const tipTop = hovered ? Math.max(0, hovered.y - 70) : 0;

  return (
    <div ref={box} className="relative w-full">
      <canvas
        ref={canvas}
        role="img"
        aria-label={label}
        style={{ width: '100%', height, display: 'block', cursor: hovered ? 'pointer' : 'crosshair' }}
        onMouseMove={(event) => {
          const next = pick(event);
          if (next !== hovered) setHovered(next);
        }}
        onMouseLeave={() => setHovered(null)}
        onClick={(event) => {
          const star = pick(event);
          if (star) onOpen(star.star);
        }}
      />
      {children}
      {hovered && values ? (
        <div
          role="tooltip"
          data-hr-tooltip=""
          className="pointer-events-none absolute z-10 w-56 rounded-sm border border-rule bg-paper px-3 py-2 text-xs text-ink shadow-md"
          style={{ left: Math.max(0, tipLeft), top: tipTop }}
        >
          <p className="font-serif text-sm font-semibold">{hovered.star.designation}</p>
          <p className="tabular-nums">
            T = {values.temperature} <span className="text-ink-soft">({hovered.star.temperature.status})</span>
          </p>
          <p className="tabular-nums">
            L = {values.luminosity} <span className="text-ink-soft">({hovered.star.luminosity.status})</span>
          </p>
          {hovered.star.luminosityClass ? <p className="text-ink-soft">{hovered.star.luminosityClass}</p> : null}
        </div>
      ) : null}
    </div>
  );
}
