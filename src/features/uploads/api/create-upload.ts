import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Upload } from '@shared/schemas/uploads';
import { api, type UploadProgress } from '@/lib/api-client';
import { uploadKeys } from './keys';
import type { WAVELENGTH_UNITS } from '@shared/physics/units';

export type SpectrumWavelengthUnit = (typeof WAVELENGTH_UNITS)[number];

export type CreateUploadInput =
  | { kind: 'measurements'; file: File }
  | { kind: 'spectrum'; file: File; targetId: number; wavelengthUnit: SpectrumWavelengthUnit };

/** Sends the file as multipart form field `file`; the server keeps it and answers with the preview. */
export async function createUpload(
  projectId: number,
  input: CreateUploadInput,
  options: { onProgress?: (progress: UploadProgress) => void; onSent?: () => void; signal?: AbortSignal } = {},
): Promise<Upload> {
  const form = new FormData();
  form.append('kind', input.kind);
  if (input.kind === 'spectrum') {
    form.append('targetId', String(input.targetId));
    form.append('wavelengthUnit', input.wavelengthUnit);
  }
  // The file goes last: the server reads the text fields before the bytes arrive.
  form.append('file', input.file, input.file.name);
  const body = await api.postMultipart<{ upload: Upload }>(`/projects/${projectId}/uploads`, form, options);
  return body.upload;
}

export function useCreateUpload(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({
      input,
      onProgress,
      onSent,
      signal,
    }: {
      input: CreateUploadInput;
      onProgress?: (progress: UploadProgress) => void;
      onSent?: () => void;
      signal?: AbortSignal;
    }) => createUpload(projectId, input, { onProgress, onSent, signal }),
    onSuccess: (upload) => {
      queryClient.setQueryData(uploadKeys.detail(projectId, upload.id), upload);
      return queryClient.invalidateQueries({ queryKey: uploadKeys.list(projectId) });
    },
  });
}
