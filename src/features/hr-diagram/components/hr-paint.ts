import { AXIS_TITLES, errorBarAlpha, outlineWidth, pointRadius, type Palette, type Scene } from './hr-scene';

/** Draws a scene on a 2D canvas context already scaled to CSS pixels. */
export function paintCanvas(ctx: CanvasRenderingContext2D, scene: Scene, palette: Palette): void {
  const { frame } = scene;
  const { left, right, top, bottom } = frame;
  ctx.save();
  ctx.fillStyle = palette.paper;
  ctx.fillRect(0, 0, frame.width, frame.height);

  ctx.save();
  ctx.beginPath();
  ctx.rect(left, top, right - left, bottom - top);
  ctx.clip();

  // Regions: light shading and their names.
  ctx.globalAlpha = 0.14;
  ctx.fillStyle = palette.rule;
  for (const region of scene.regions) {
    for (const outline of region.outlines) {
      ctx.beginPath();
      outline.forEach(([x, y], i) => (i === 0 ? ctx.moveTo(x, y) : ctx.lineTo(x, y)));
      ctx.closePath();
      ctx.fill();
    }
  }
  // A thin edge tells neighbouring regions apart where their shading alone would merge.
  ctx.globalAlpha = 0.7;
  ctx.strokeStyle = palette.rule;
  ctx.lineWidth = 0.75;
  for (const region of scene.regions) {
    for (const outline of region.outlines) {
      ctx.beginPath();
      outline.forEach(([x, y], i) => (i === 0 ? ctx.moveTo(x, y) : ctx.lineTo(x, y)));
      ctx.closePath();
      ctx.stroke();
    }
  }
  ctx.globalAlpha = 1;

  // Lines of constant radius.
  ctx.strokeStyle = palette.rule;
  ctx.lineWidth = 1;
  ctx.setLineDash([4, 4]);
  ctx.beginPath();
  for (const line of scene.radii) {
    ctx.moveTo(line.points[0][0], line.points[0][1]);
    ctx.lineTo(line.points[1][0], line.points[1][1]);
  }
  ctx.stroke();
  ctx.setLineDash([]);

  ctx.font = '11px "Public Sans Variable", system-ui, sans-serif';
  ctx.fillStyle = palette.inkSoft;
  ctx.textBaseline = 'alphabetic';
  ctx.textAlign = 'left';
  for (const line of scene.radii) ctx.fillText(line.label, line.labelAt[0], line.labelAt[1]);

  // Error bars, one path.
  const n = scene.stars.length;
  ctx.globalAlpha = errorBarAlpha(n);
  ctx.strokeStyle = palette.inkSoft;
  ctx.beginPath();
  for (const s of scene.stars) {
    ctx.moveTo(s.x0, s.y);
    ctx.lineTo(s.x1, s.y);
    ctx.moveTo(s.x, s.y0);
    ctx.lineTo(s.x, s.y1);
  }
  ctx.stroke();
  ctx.globalAlpha = 1;

  // Points: grouped by colour so thousands take a few hundred fills, each with a thin outline for contrast on paper and on black.
  const groups = new Map<string, typeof scene.stars>();
  for (const s of scene.stars) {
    const key = `${s.colour}|${s.highlighted ? 1 : 0}`;
    const list = groups.get(key);
    if (list) list.push(s);
    else groups.set(key, [s]);
  }
  for (const highlightedPass of [false, true]) {
    for (const [key, list] of groups) {
      const highlighted = key.endsWith('|1');
      if (highlighted !== highlightedPass) continue;
      const r = pointRadius(n, highlighted);
      ctx.globalAlpha = scene.highlighting && !highlighted ? 0.35 : 1;
      ctx.fillStyle = list[0].colour;
      ctx.strokeStyle = highlighted ? palette.accent : palette.redOnly ? palette.paper : palette.ink;
      ctx.lineWidth = outlineWidth(n, highlighted);
      ctx.beginPath();
      for (const s of list) {
        ctx.moveTo(s.x + r, s.y);
        ctx.arc(s.x, s.y, r, 0, 2 * Math.PI);
      }
      ctx.fill();
      ctx.stroke();
    }
  }
  ctx.globalAlpha = 1;

  // Region names last, on a halo of paper, so a crowded band does not hide its own name.
  ctx.font = `italic ${frame.width < 520 ? 10 : 12}px "Source Serif 4 Variable", Georgia, serif`;
  ctx.textAlign = 'center';
  ctx.lineJoin = 'round';
  ctx.lineWidth = 3;
  ctx.strokeStyle = palette.paper;
  ctx.fillStyle = palette.inkSoft;
  for (const region of scene.regions) {
    if (region.outlines.length === 0) continue;
    ctx.strokeText(region.label, region.labelAt[0], region.labelAt[1]);
    ctx.fillText(region.label, region.labelAt[0], region.labelAt[1]);
  }
  ctx.restore();

  // Axes, ticks and titles.
  ctx.strokeStyle = palette.ink;
  ctx.lineWidth = 1;
  ctx.strokeRect(left + 0.5, top + 0.5, right - left - 1, bottom - top - 1);
  ctx.fillStyle = palette.ink;
  ctx.font = '12px "Public Sans Variable", system-ui, sans-serif';
  ctx.beginPath();
  ctx.textAlign = 'center';
  ctx.textBaseline = 'top';
  for (const t of scene.xTicks) {
    ctx.moveTo(t.x, bottom);
    ctx.lineTo(t.x, bottom + 5);
    ctx.fillText(t.label, t.x, bottom + 7);
  }
  ctx.textAlign = 'right';
  ctx.textBaseline = 'middle';
  for (const t of scene.yTicks) {
    ctx.moveTo(left - 5, t.y);
    ctx.lineTo(left, t.y);
    ctx.fillText(t.label, left - 7, t.y);
  }
  ctx.stroke();
  ctx.textAlign = 'center';
  ctx.textBaseline = 'bottom';
  ctx.fillText(AXIS_TITLES.x, (left + right) / 2, frame.height - 4);
  ctx.save();
  ctx.translate(12, (top + bottom) / 2);
  ctx.rotate(-Math.PI / 2);
  ctx.textBaseline = 'middle';
  ctx.fillText(AXIS_TITLES.y, 0, 0);
  ctx.restore();
  ctx.restore();
}

const esc = (text: string) => text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
const f = (n: number) => (Math.round(n * 10) / 10).toString();

/** The same drawing as a standalone SVG document. */
export function sceneToSvg(scene: Scene, palette: Palette, title: string): string {
  const { frame } = scene;
  const { left, right, top, bottom } = frame;
  const n = scene.stars.length;
  const out: string[] = [];
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${frame.width}" height="${frame.height}" viewBox="0 0 ${frame.width} ${frame.height}" font-family="Public Sans, system-ui, sans-serif">`,
    `<title>${esc(title)}</title>`,
    `<rect width="100%" height="100%" fill="${palette.paper}"/>`,
    `<defs><clipPath id="plot"><rect x="${left}" y="${top}" width="${right - left}" height="${bottom - top}"/></clipPath></defs>`,
    `<g clip-path="url(#plot)">`,
  );
  for (const region of scene.regions) {
    for (const outline of region.outlines) {
      out.push(`<path d="M${outline.map(([x, y]) => `${f(x)} ${f(y)}`).join('L')}Z" fill="${palette.rule}" fill-opacity="0.14" stroke="${palette.rule}" stroke-opacity="0.7" stroke-width="0.75"/>`);
    }
  }
  out.push(
    `<path d="${scene.radii.map((l) => `M${f(l.points[0][0])} ${f(l.points[0][1])}L${f(l.points[1][0])} ${f(l.points[1][1])}`).join('')}" stroke="${palette.rule}" stroke-dasharray="4 4" fill="none"/>`,
  );
  for (const l of scene.radii) out.push(`<text x="${f(l.labelAt[0])}" y="${f(l.labelAt[1])}" font-size="11" fill="${palette.inkSoft}">${esc(l.label)}</text>`);
  out.push(
    `<path d="${scene.stars.map((s) => `M${f(s.x0)} ${f(s.y)}H${f(s.x1)}M${f(s.x)} ${f(s.y0)}V${f(s.y1)}`).join('')}" stroke="${palette.inkSoft}" stroke-opacity="${errorBarAlpha(n)}" fill="none"/>`,
  );
  const ordered = [...scene.stars].sort((a, b) => Number(a.highlighted) - Number(b.highlighted));
  for (const s of ordered) {
    const r = pointRadius(n, s.highlighted);
    const stroke = s.highlighted ? palette.accent : palette.redOnly ? palette.paper : palette.ink;
    const faint = scene.highlighting && !s.highlighted ? ' opacity="0.35"' : '';
    out.push(
      `<circle cx="${f(s.x)}" cy="${f(s.y)}" r="${r}" fill="${s.colour}" stroke="${stroke}" stroke-width="${outlineWidth(n, s.highlighted)}"${faint}><title>${esc(s.star.designation)}</title></circle>`,
    );
  }
  for (const r of scene.regions) {
    if (r.outlines.length > 0) {
      out.push(
        `<text x="${f(r.labelAt[0])}" y="${f(r.labelAt[1])}" font-size="12" font-style="italic" font-family="Source Serif 4, Georgia, serif" text-anchor="middle" fill="${palette.inkSoft}" stroke="${palette.paper}" stroke-width="3" stroke-linejoin="round" paint-order="stroke">${esc(r.label)}</text>`,
      );
    }
  }
  out.push('</g>');
  out.push(`<rect x="${left + 0.5}" y="${top + 0.5}" width="${right - left - 1}" height="${bottom - top - 1}" fill="none" stroke="${palette.ink}"/>`);
  for (const t of scene.xTicks) {
    out.push(`<path d="M${f(t.x)} ${bottom}v5" stroke="${palette.ink}"/><text x="${f(t.x)}" y="${bottom + 19}" font-size="12" text-anchor="middle" fill="${palette.ink}">${esc(t.label)}</text>`);
  }
  for (const t of scene.yTicks) {
    out.push(`<path d="M${left - 5} ${f(t.y)}h5" stroke="${palette.ink}"/><text x="${left - 7}" y="${f(t.y + 4)}" font-size="12" text-anchor="end" fill="${palette.ink}">${esc(t.label)}</text>`);
  }
  out.push(`<text x="${f((left + right) / 2)}" y="${frame.height - 6}" font-size="12" text-anchor="middle" fill="${palette.ink}">${esc(AXIS_TITLES.x)}</text>`);
  out.push(`<text transform="translate(16 ${f((top + bottom) / 2)}) rotate(-90)" font-size="12" text-anchor="middle" fill="${palette.ink}">${esc(AXIS_TITLES.y)}</text>`);
  out.push('</svg>');
  return out.join('\n');
}
