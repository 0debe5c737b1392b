import { useId, useRef, useState, type DragEvent, type FormEvent } from 'react';
import type { Upload } from '@shared/schemas/uploads';
import { UNITS, WAVELENGTH_UNITS } from '@shared/physics/units';
import { isApiError, type UploadProgress } from '@/lib/api-client';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { FieldGroup, SelectField } from '@/components/ui/field';
import { cn } from '@/lib/cn';
import { useCreateUpload, type SpectrumWavelengthUnit } from '../api/create-upload';
import { formatBytes } from './upload-words';

export interface TargetChoice {
  id: number;
  designation: string;
}

const UNIT_NAMES: Record<SpectrumWavelengthUnit, string> = { nm: 'nanometres', angstrom: 'ångström', um: 'micrometres', m: 'metres' };
const WAVELENGTH_CHOICES: ReadonlyArray<{ value: SpectrumWavelengthUnit; label: string }> = WAVELENGTH_UNITS.map((u) => ({ value: u, label: `${UNITS[u].symbol} (${UNIT_NAMES[u]})` }));

type FileKind = 'measurements' | 'spectrum';

const FILE_KINDS: ReadonlyArray<{ kind: FileKind; title: string; description: string }> = [
  {
    kind: 'measurements',
    title: 'Measurements',
    description: 'a CSV with a header row, one measurement per row (long layout) or a column per quantity (wide layout).',
  },
  {
    kind: 'spectrum',
    title: 'Spectrum of one target',
    description: 'two columns, wavelength and flux (a third for the flux uncertainty is read too).',
  },
];

type Stage = { name: 'idle' } | { name: 'sending'; progress: UploadProgress } | { name: 'reading' };

/** The byte count sent so far, as a bar and in words; the server's reading time follows as its own stage. */
function ProgressBar({ stage, size }: { stage: Stage; size: number }) {
  if (stage.name === 'idle') return null;
  const total = stage.name === 'sending' ? (stage.progress.total ?? size) : size;
  const loaded = stage.name === 'sending' ? stage.progress.loaded : total;
  const percent = total > 0 ? Math.min(100, Math.round((loaded / total) * 100)) : 0;
  const words =
    stage.name === 'sending'
      ? `${formatBytes(loaded)} of ${formatBytes(total)} sent (${percent} %)`
      : 'All bytes sent. The server is reading the file and checking every row…';
  return (
    <div className="mt-4" data-testid="upload-progress">
      <div
        role="progressbar"
        aria-label="Upload progress"
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent}
        aria-valuetext={words}
        className="h-3 w-full overflow-hidden rounded-sm border border-rule bg-paper-deep"
      >
        <div className={cn('h-full bg-brass transition-[width]', stage.name === 'reading' && 'animate-pulse')} style={{ width: `${percent}%` }} />
      </div>
      <p className="mt-1 text-sm text-ink-soft tabular-nums" aria-live="polite">
        {words}
      </p>
    </div>
  );
}

/**
 * Choosing or dropping one file, saying what it is (measurements, or one
 * target's spectrum), and sending it with a true byte count. Nothing is
 * imported here: the server answers with a preview.
 */
export function UploadForm({
  projectId,
  targets,
  targetsLoading,
  onUploaded,
}: {
  projectId: number;
  targets: readonly TargetChoice[];
  targetsLoading: boolean;
  onUploaded: (upload: Upload) => void;
}) {
  const [kind, setKind] = useState<FileKind>('measurements');
  const [file, setFile] = useState<File | null>(null);
  const [targetId, setTargetId] = useState('');
  const [wavelengthUnit, setWavelengthUnit] = useState<SpectrumWavelengthUnit>('nm');
  const [dragging, setDragging] = useState(false);
  const [stage, setStage] = useState<Stage>({ name: 'idle' });
  const [problems, setProblems] = useState<{ file?: string; targetId?: string; form?: string }>({});
  const abort = useRef<AbortController | null>(null);
  const createUpload = useCreateUpload(projectId);
  const inputId = useId();
  const hintId = `${inputId}-hint`;
  const fileErrorId = `${inputId}-error`;
  const busy = stage.name !== 'idle';

  function choose(files: FileList | null) {
    if (!files || files.length === 0) return;
    if (files.length > 1) {
      setProblems({ file: 'Drop one file at a time; each file is previewed and committed on its own.' });
      return;
    }
    setFile(files[0]);
    setProblems({});
  }

  function onDrop(event: DragEvent<HTMLDivElement>) {
    event.preventDefault();
    setDragging(false);
    if (!busy) choose(event.dataTransfer.files);
  }

  function submit(event: FormEvent) {
    event.preventDefault();
    const found: typeof problems = {};
    if (!file) found.file = 'Choose a file, or drop one on the box.';
    else if (file.size === 0) found.file = `“${file.name}” is empty; choose the file with the night’s rows.`;
    if (kind === 'spectrum' && !targetId) found.targetId = 'Choose the target this spectrum belongs to.';
    setProblems(found);
    if (Object.keys(found).length > 0 || !file) return;

    const controller = new AbortController();
    abort.current = controller;
    setStage({ name: 'sending', progress: { loaded: 0, total: file.size } });
    createUpload.mutate(
      {
        input: kind === 'spectrum' ? { kind, file, targetId: Number(targetId), wavelengthUnit } : { kind, file },
        signal: controller.signal,
        onProgress: (progress) => setStage({ name: 'sending', progress }),
        onSent: () => setStage({ name: 'reading' }),
      },
      {
        onSuccess: (upload) => onUploaded(upload),
        onError: (error) => {
          setStage({ name: 'idle' });
          if (error instanceof DOMException && error.name === 'AbortError') {
            setProblems({ form: 'The upload was cancelled; nothing was kept.' });
            return;
          }
          const next: typeof problems = {};
          const rest: string[] = [];
          for (const issue of isApiError(error) ? error.fieldIssues : []) {
            if (issue.path === 'file' && !next.file) next.file = issue.message;
            else if (issue.path === 'targetId' && !next.targetId) next.targetId = issue.message;
            else rest.push(issue.path ? `${issue.path}: ${issue.message}` : issue.message);
          }
          if (!next.file && !next.targetId) next.form = [error.message, ...rest].join(' ');
          else if (rest.length > 0) next.form = rest.join(' ');
          setProblems(next);
        },
      },
    );
  }

  return (
    <form onSubmit={submit} noValidate aria-label="Upload a file" className="space-y-5">
      <FieldGroup legend="What the file holds">
        <div className="mt-2 space-y-2 text-sm" role="radiogroup" aria-label="Kind of file">
          {FILE_KINDS.map((option) => (
            <label key={option.kind} className="flex items-start gap-2">
              <input
                type="radio"
                name="kind"
                value={option.kind}
                checked={kind === option.kind}
                disabled={busy}
                onChange={() => setKind(option.kind)}
                className="mt-1 accent-[var(--sl-brass)]"
              />
              <span>
                <span className="font-semibold">{option.title}</span> <span className="text-ink-soft">— {option.description}</span>
              </span>
            </label>
          ))}
        </div>
        {kind === 'spectrum' ? (
          <div className="mt-4 grid gap-4 sm:grid-cols-2">
            <SelectField
              label="Target"
              value={targetId}
              disabled={busy || targetsLoading}
              onChange={(e) => {
                setTargetId(e.target.value);
                setProblems((p) => ({ ...p, targetId: undefined }));
              }}
              error={problems.targetId}
              hint={targetsLoading ? 'Loading the project’s targets…' : undefined}
            >
              <option value="">Choose a target…</option>
              {targets.map((t) => (
                <option key={t.id} value={t.id}>
                  {t.designation}
                </option>
              ))}
            </SelectField>
            <SelectField
              label="Wavelength unit"
              value={wavelengthUnit}
              disabled={busy}
              onChange={(e) => setWavelengthUnit(e.target.value as SpectrumWavelengthUnit)}
              hint="The unit of the first column."
            >
              {WAVELENGTH_CHOICES.map((u) => (
                <option key={u.value} value={u.value}>
                  {u.label}
                </option>
              ))}
            </SelectField>
          </div>
        ) : null}
      </FieldGroup>

      <div
        onDragEnter={(e) => {
          e.preventDefault();
          if (!busy) setDragging(true);
        }}
        onDragOver={(e) => e.preventDefault()}
        onDragLeave={() => setDragging(false)}
        onDrop={onDrop}
        data-testid="drop-zone"
        className={cn(
          'rounded-sm border-2 border-dashed px-6 py-8 text-center',
          dragging ? 'border-brass bg-paper-deep' : problems.file ? 'border-alert' : 'border-rule',
        )}
      >
        <p className="font-serif text-lg font-semibold">{dragging ? 'Drop the file to choose it' : 'Drop a CSV file here'}</p>
        <p className="mt-1 text-sm text-ink-soft">or choose it from your computer:</p>
        <div className="mt-3 flex flex-wrap items-center justify-center gap-3">
          <label htmlFor={inputId} className="text-sm font-semibold">
            Measurement file
          </label>
          <input
            id={inputId}
            type="file"
            accept=".csv,.txt,.tsv,text/csv,text/plain"
            disabled={busy}
            aria-describedby={[hintId, problems.file ? fileErrorId : ''].filter(Boolean).join(' ')}
            aria-invalid={problems.file ? true : undefined}
            onChange={(e) => choose(e.target.files)}
            className="text-sm file:mr-3 file:rounded-sm file:border file:border-ink-soft file:bg-transparent file:px-3 file:py-1.5 file:text-sm file:text-ink"
          />
        </div>
        <p id={hintId} className="mt-2 text-xs text-ink-soft">
          CSV with a header row; commas, semicolons or tabs; up to 20 MB.
        </p>
        {file ? (
          <p className="mt-3 text-sm" data-testid="chosen-file">
            Chosen: <span className="font-semibold">{file.name}</span> <span className="text-ink-soft tabular-nums">({formatBytes(file.size)})</span>
          </p>
        ) : null}
        {problems.file ? (
          <p id={fileErrorId} className="mt-2 text-sm font-medium text-alert">
            <span className="font-semibold">Error:</span> {problems.file}
          </p>
        ) : null}
      </div>

      <ProgressBar stage={stage} size={file?.size ?? 0} />

      {problems.form ? <Alert title="The file was not uploaded.">{problems.form}</Alert> : null}

      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={busy}>
          {busy ? 'Uploading…' : 'Upload and preview'}
        </Button>
        {stage.name === 'sending' ? (
          <Button variant="secondary" onClick={() => abort.current?.abort()}>
            Cancel upload
          </Button>
        ) : null}
        <p className="text-sm text-ink-soft">Nothing is imported until you have seen the preview and commit it.</p>
      </div>
    </form>
  );
}
