import { useCallback, useMemo, useRef } from 'react';
import { useNavigate, useSearchParams } from 'react-router-dom';
import type { HrStar } from '@shared/schemas/hr';
import { roleCan } from '@shared/schemas/roles';
import { labelNamesClass } from '@shared/physics/luminosity-class';
import { LUMINOSITY_CLASS_LABELS, LUMINOSITY_CLASSES, type LuminosityClassName } from '@shared/physics/main-sequence';
import { paths } from '@/config/paths';
import { useNumericParam } from '@/hooks/use-numeric-param';
import { PageHeader } from '@/components/ui/page-header';
import { StatusLine } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SelectField } from '@/components/ui/field';
import { EmptyState } from '@/components/ui/empty-state';
import { NotFoundMessage } from '@/components/errors/error-messages';
import { QueryError } from '@/components/errors/query-error';
import { formatCount } from '@/lib/format';
import { useProject } from '@/features/projects/api/get-project';
import { useHr } from '@/features/hr-diagram/api/get-hr';
import { HrPlot } from '@/features/hr-diagram/components/hr-plot';
import { HrStarList } from '@/features/hr-diagram/components/hr-star-list';
import { savePng, saveSvg } from '@/features/hr-diagram/components/save-drawing';
import type { Palette, Scene } from '@/features/hr-diagram/components/hr-scene';

const isClass = (v: string | null): v is LuminosityClassName => v !== null && (LUMINOSITY_CLASSES as readonly string[]).includes(v);

function HrDiagramPage({ projectId }: { projectId: number }) {
  const project = useProject(projectId);
  const navigate = useNavigate();
  const [search, setSearch] = useSearchParams();
  const canSeeProposed = roleCan(project.data?.myRole, 'readProposed');
  // Readers are served approved values only; the choice is not offered to them.
  const include = canSeeProposed && search.get('include') === 'proposed' ? 'proposed' : 'approved';
  const classParam = search.get('class');
  const lumClass = isClass(classParam) ? classParam : null;
  const tag = search.get('tag') || null;
  const hr = useHr(projectId, include);
  const drawing = useRef<{ scene: Scene; palette: Palette; canvas: HTMLCanvasElement } | null>(null);
  const onScene = useCallback((scene: Scene, palette: Palette, canvas: HTMLCanvasElement) => {
    drawing.current = { scene, palette, canvas };
  }, []);

  const all = hr.data?.stars;
  const stars = useMemo(() => (all ?? []).filter((s) => !lumClass || (s.luminosityClass !== null && labelNamesClass(s.luminosityClass, lumClass))), [all, lumClass]);
  const tags = useMemo(() => [...new Set((all ?? []).flatMap((s) => s.tags))].sort((a, b) => a.localeCompare(b)), [all]);

  const set = (name: string, value: string | null) =>
    setSearch(
      (current) => {
        const next = new URLSearchParams(current);
        if (value) next.set(name, value);
        else next.delete(name);
        return next;
      },
      { replace: true },
    );

  if (project.isPending) return <StatusLine>Loading the project…</StatusLine>;
  if (project.isError) return <QueryError what="The project" error={project.error} onRetry={() => void project.refetch()} />;
  const { data } = project;
  const hrefOf = (star: HrStar) => paths.project.target.getHref(projectId, star.id);
  const title = `HR diagram of ${data.code}`;
  const fileBase = `${data.code}-hr-diagram`;
  const highlighted = tag ? stars.filter((s) => s.tags.includes(tag)).length : 0;

  return (
    <>
      <title>{`HR diagram · ${data.code} · Starledger`}</title>
      <PageHeader
        eyebrow={data.code}
        title="HR diagram"
        description="Every target with an adopted temperature and luminosity, each drawn in the colour of a blackbody at its temperature, with 1σ error bars, lines of constant radius and the regions of the luminosity classes as the engine draws them."
        actions={
          <>
            <Button variant="secondary" disabled={stars.length === 0} onClick={() => drawing.current && savePng(drawing.current.canvas, `${fileBase}.png`)}>
              Save PNG
            </Button>
            <Button
              variant="secondary"
              disabled={stars.length === 0}
              onClick={() => drawing.current && saveSvg(drawing.current.scene, drawing.current.palette, title, `${fileBase}.svg`)}
            >
              Save SVG
            </Button>
          </>
        }
      />
      <form className="mb-4 grid gap-4 sm:grid-cols-3" role="search" aria-label="What the diagram shows" onSubmit={(e) => e.preventDefault()}>
        {!canSeeProposed ? null : (
          <SelectField label="Values" value={include} onChange={(e) => set('include', e.target.value === 'proposed' ? 'proposed' : null)}>
            <option value="approved">Approved values only</option>
            <option value="proposed">Include the newest proposals</option>
          </SelectField>
        )}
        <SelectField label="Luminosity class" value={lumClass ?? ''} onChange={(e) => set('class', e.target.value || null)}>
          <option value="">Every class</option>
          {LUMINOSITY_CLASSES.map((c) => (
            <option key={c} value={c}>
              {LUMINOSITY_CLASS_LABELS[c]}
            </option>
          ))}
        </SelectField>
        <SelectField
          label="Highlight a tag"
          value={tag ?? ''}
          onChange={(e) => set('tag', e.target.value || null)}
          disabled={tags.length === 0}
          hint={tags.length === 0 ? 'No plotted target has a tag.' : tag ? `${formatCount(highlighted, 'star')} highlighted.` : undefined}
        >
          <option value="">No highlight</option>
          {tags.map((t) => (
            <option key={t} value={t}>
              {t}
            </option>
          ))}
        </SelectField>
      </form>
      {hr.isPending ? <StatusLine>Loading the diagram…</StatusLine> : null}
      {hr.isError && !hr.data ? <QueryError what="The diagram" error={hr.error} onRetry={() => void hr.refetch()} inline /> : null}
      {hr.data && hr.data.stars.length === 0 ? (
        <EmptyState title="No star to draw yet">
          {include === 'approved'
            ? 'A target appears here once its temperature and luminosity are approved.'
            : 'A target appears here once it has a temperature and a luminosity.'}
        </EmptyState>
      ) : null}
      {hr.data && hr.data.stars.length > 0 ? (
        <>
          <p className="mb-2 text-sm text-ink-soft" aria-live="polite">
            {formatCount(stars.length, 'star')} on the diagram
            {include === 'proposed' ? ', with the newest proposals where there are any' : ', approved values only'}
            {lumClass ? `, ${LUMINOSITY_CLASS_LABELS[lumClass]} only` : ''}. Point at a star for its values; click it to open its sheet.
          </p>
          <HrPlot
            stars={stars}
            highlightTag={tag}
            label={`${title}: ${formatCount(stars.length, 'star')}, luminosity against temperature. The list “Stars on the diagram” below gives each star’s values and a link to its sheet.`}
            onOpen={(star) => void navigate(hrefOf(star))}
            onScene={onScene}
          />
          <p className="mt-2 text-xs text-ink-soft">
            Colours: Planck’s law integrated against the CIE 1931 colour-matching functions (Wyman, Sloan &amp; Shirley 2013 fit), shown in sRGB
            (IEC 61966-2-1). Regions: the engine’s luminosity-class offsets from the dwarf sequence of Pecaut &amp; Mamajek (2013) and its plausible
            radii; dashed lines of constant radius by the Stefan–Boltzmann law. In the night theme every star is drawn in the theme’s red, so the
            diagram gives off red light only.
          </p>
          <HrStarList stars={stars} hrefOf={hrefOf} />
        </>
      ) : null}
    </>
  );
}

export function HrDiagramRoute() {
  const projectId = useNumericParam('projectId');
  if (projectId === null) return <NotFoundMessage />;
  return <HrDiagramPage key={projectId} projectId={projectId} />;
}
