import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import type { DatasetUploadResponse } from '../../../../../shared/datasets';
import { apiErrorSchema } from '../../../../../shared/errors';
import { ApiError, redirectToSignIn } from '../../../lib/api-client';
import { datasetKeys } from './dataset-keys';

export type UploadPhase = 'idle' | 'uploading' | 'checking' | 'done';

/**
 * Sends the file with XMLHttpRequest, the one browser API that reports upload progress;
 * errors become the same ApiError the api-client gives.
 */
export function uploadDataset(
  file: File,
  sheet: string,
  onProgress: (sent: number) => void,
  onUploaded: () => void,
): Promise<DatasetUploadResponse> {
  return new Promise((resolve, reject) => {
    const form = new FormData();
    form.append('file', file);
    if (sheet.trim() !== '') form.append('sheet', sheet.trim());
    const xhr = new XMLHttpRequest();
    xhr.open('POST', '/api/datasets');
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.setRequestHeader('X-Requested-With', 'coppice');
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable) onProgress(event.loaded / event.total);
    };
    xhr.upload.onload = () => onUploaded();
    xhr.onerror = () =>
      reject(
        new ApiError(
          0,
          'network_error',
          'Coppice could not reach the server. Check the connection and try again.',
        ),
      );
    xhr.onload = () => {
      let body: unknown;
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        body = undefined;
      }
      if (xhr.status >= 200 && xhr.status < 300) {
        resolve(body as DatasetUploadResponse);
        return;
      }
      if (xhr.status === 401) redirectToSignIn();
      const parsed = apiErrorSchema.safeParse(body);
      reject(
        parsed.success
          ? new ApiError(
              xhr.status,
              parsed.data.error.code,
              parsed.data.error.message,
              parsed.data.error.details,
            )
          : new ApiError(xhr.status, 'http_error', `The server answered with status ${xhr.status}.`),
      );
    };
    xhr.send(form);
  });
}

/** Upload with its phases: sending the bytes (with progress), then the server reading and checking them. */
export function useUploadDataset() {
  const queryClient = useQueryClient();
  const [phase, setPhase] = useState<UploadPhase>('idle');
  const [progress, setProgress] = useState(0);
  const mutation = useMutation({
    mutationFn: ({ file, sheet = '' }: { file: File; sheet?: string }) => {
      setPhase('uploading');
      setProgress(0);
      return uploadDataset(file, sheet, setProgress, () => setPhase('checking'));
    },
    onSuccess: () => {
      setPhase('done');
      return queryClient.invalidateQueries({ queryKey: datasetKeys.list() });
    },
    onError: () => setPhase('idle'),
  });
  return { ...mutation, phase, progress };
}
