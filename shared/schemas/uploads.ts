import { z } from 'zod';
import { columnMapping, type ColumnMapping, type RowError } from '../file-reading/measurement-file';
import { idParam } from './common';
import { WAVELENGTH_UNITS } from '../physics/units';
import { projectParams } from './params';

export const uploadKinds = ['measurements', 'spectrum'] as const;
export const uploadStatuses = ['previewed', 'committed', 'discarded'] as const;

const jsonField = <S extends z.ZodType>(schema: S) =>
  z
    .string()
    .transform((text, ctx) => {
      try {
        return JSON.parse(text) as unknown;
      } catch {
        ctx.addIssue({ code: 'custom', message: 'Not valid JSON.' });
        return z.NEVER;
      }
    })
    .pipe(schema);

/** The text fields that travel with the multipart file. */
export const createUploadFields = z.object({
  kind: z.enum(uploadKinds).default('measurements'),
  mapping: jsonField(columnMapping).optional(),
  targetId: z.coerce.number().int().positive().optional(),
  wavelengthUnit: z.enum(WAVELENGTH_UNITS).optional(),
});
export type CreateUploadFields = z.output<typeof createUploadFields>;

export const remapBody = z.object({ mapping: columnMapping });
export const commitBody = z.object({
  /** Commit even though the same bytes were uploaded before. */
  confirmDuplicate: z.boolean().default(false),
});
export const uploadParams = projectParams.extend({ uploadId: idParam });
export const uploadRowsQuery = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(100),
  onlyErrors: z.enum(['true', 'false']).default('false').transform((v) => v === 'true'),
});

/** How many of an upload's errors travel with it (in the list and the single view); the rest are paged from `…/errors`. */
export const ERRORS_SHOWN = 20;

export const uploadErrorsQuery = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(100),
});

export interface UploadErrorsPage {
  errors: RowError[];
  total: number;
  page: number;
  pageSize: number;
}

/** Where a commit under way has got to, for the upload page to show while it runs. */
export interface UploadProgress {
  uploadId: number;
  phase: 'queued' | 'reading' | 'writing' | 'deriving' | 'done' | 'failed';
  rowsWritten: number;
  rowsTotal: number;
  targetsDerived: number;
  targetsTotal: number;
}

export interface Caution {
  row: number | null;
  target: string;
  message: string;
}

export interface SpectrumPreview {
  targetId: number;
  wavelengthUnit: string;
  /** [wavelength m, flux as sent] */
  points: [number, number][];
  fit: {
    temperatureK: number;
    temperatureSigmaK: number;
    logScale: number;
    /**
     * χ² per degree of freedom. Without flux uncertainties (`weighted` false)
     * the points are weighted by a noise level estimated from the scatter
     * itself, so this is near 1 by construction and not a goodness-of-fit
     * number (spectra stored before that was so have the residual variance
     * in flux units squared here).
     */
    reducedChiSquare: number;
    /** Whether the file gave flux uncertainties. */
    weighted: boolean;
    /** The fit's assumption about the noise, in words (absent on spectra stored before it was recorded). */
    noiseWords?: string;
    /**
     * The continuum peak, found apart from the Planck fit: null when the data
     * do not turn over inside the observed range (a hot star seen in the
     * optical), and `noPeakReason` says why in words. Spectra stored before
     * this field existed always have a peak.
     */
    peakWavelengthM: number | null;
    peakWavelengthSigmaM: number | null;
    noPeakReason?: string | null;
    warnings: { code: string; message: string }[];
  } | null;
}

export interface Upload {
  id: number;
  projectId: number;
  kind: (typeof uploadKinds)[number];
  filename: string;
  sizeBytes: number;
  sha256: string;
  status: (typeof uploadStatuses)[number];
  rowCount: number;
  measurementCount: number;
  errorCount: number;
  /** The first ERRORS_SHOWN errors by row; all of them come page by page from `…/errors`. */
  errors: RowError[];
  mapping: ColumnMapping | null;
  headers: string[];
  /** Targets the commit creates: new designations with at least one row free of errors. */
  newTargets: string[];
  /** Rows of the file that name a target the project does not have and have errors. */
  newTargetErrorRows: number;
  /** Every row names a target the project already has (false when the file cannot say). */
  everyRowKnownTarget: boolean;
  cautions: Caution[];
  duplicateOf: number | null;
  spectrum: DrawnSpectrum | null;
  /** Targets whose measurements came from this upload (committed uploads, in the single-upload view). */
  targets: { id: number; designation: string }[];
  uploadedBy: string | null;
  createdAt: string;
  committedAt: string | null;
}

export interface CommitResult {
  upload: Upload;
  measurementsAdded: number;
  targetsCreated: string[];
  derivedProposed: number;
  /** Every target the file touched, for links. */
  targets: { id: number; designation: string }[];
}

/**
 * A spectrum as answered to be drawn: at most MOST_POINTS_DRAWN of its
 * points (shared/schemas/spectrum-drawing.ts) and how many it has.
 */
export type DrawnSpectrum = SpectrumPreview & { pointCount: number };

export interface StoredSpectrum {
  id: number;
  uploadId: number | null;
  /** [wavelength m, flux as sent]: the points drawn, every n-th when there are more than MOST_POINTS_DRAWN. */
  points: [number, number][];
  /** How many points the spectrum has. */
  pointCount: number;
  fit: NonNullable<SpectrumPreview['fit']>;
  createdAt: string;
}

export interface UploadRowsPage {
  headers: string[];
  rows: { row: number; cells: string[]; errors: RowError[] }[];
  total: number;
  page: number;
  pageSize: number;
}
