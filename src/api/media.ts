// Media of one build: list, edit, delete, and uploads through XMLHttpRequest so each file has a
// real progress figure and can be cancelled.
import { api, qs, ApiError, keyHeaders, type ChangeOptions } from './http';
import type { MediaKind, MediaStage } from '@shared/domain';
import type { MediaAnswer, MediaPage, MediaRecord } from '@shared/contracts/media';

export type { MediaRecord, MediaPage };

export interface MediaQuery {
  upgradeId?: number | null;
  episodeId?: number | null;
  partId?: number | null;
  stage?: MediaStage | null;
  kind?: MediaKind | null;
  page?: number;
  pageSize?: number;
}

export interface UploadFields {
  kind?: MediaKind;
  stage?: MediaStage | null;
  upgradeId?: number | null;
  episodeId?: number | null;
  partId?: number | null;
  caption?: string | null;
}

export interface UploadHandle {
  done: Promise<MediaRecord>;
  abort: () => void;
}

const base = (buildId: number) => `/api/builds/${buildId}/media`;

export const mediaApi = {
  list: (buildId: number, q: MediaQuery = {}) => api.get<MediaPage>(base(buildId) + qs({ ...q })),
  update: (buildId: number, id: number, body: { caption?: string | null; stage?: MediaStage | null }) =>
    api.patch<MediaAnswer>(`${base(buildId)}/${id}`, body),
  remove: (buildId: number, id: number) => api.del<void>(`${base(buildId)}/${id}`),
  downloadUrl: (buildId: number, id: number) => `${base(buildId)}/${id}/download`,

  /** Uploads one file; `onProgress` gets 0…1 as the bytes leave the browser. */
  upload(
    buildId: number,
    file: File,
    fields: UploadFields,
    onProgress: (fraction: number) => void,
    opts: ChangeOptions = {},
  ): UploadHandle {
    const xhr = new XMLHttpRequest();
    const done = new Promise<MediaRecord>((resolve, reject) => {
      const form = new FormData();
      // Fields before the file, so the server reads them first.
      for (const [k, v] of Object.entries(fields))
        if (v !== undefined && v !== null && v !== '') form.append(k, String(v));
      form.append('file', file, file.name);
      xhr.open('POST', base(buildId));
      xhr.setRequestHeader('X-Requested-With', 'Bayslate');
      xhr.setRequestHeader('Accept', 'application/json');
      for (const [k, v] of Object.entries(keyHeaders(opts.idempotencyKey))) xhr.setRequestHeader(k, v);
      xhr.responseType = 'json';
      xhr.upload.onprogress = (e) => {
        if (e.lengthComputable) onProgress(e.loaded / e.total);
      };
      xhr.onload = () => {
        const body = (xhr.response ?? {}) as {
          media?: MediaRecord;
          error?: { code?: string; message?: string; fields?: { path: string; message: string }[] };
        };
        if (xhr.status === 201 && body.media) return resolve(body.media);
        const fallback =
          xhr.status === 413 ? 'The file is too large for this kind of upload.' : `The server answered ${xhr.status}.`;
        reject(
          new ApiError(
            xhr.status,
            body.error?.code ?? `http_${xhr.status}`,
            body.error?.message ?? fallback,
            body.error?.fields ?? [],
          ),
        );
      };
      xhr.onerror = () =>
        reject(new ApiError(0, 'network', 'The upload was interrupted. Check the connection and try again.'));
      xhr.onabort = () => reject(new ApiError(0, 'aborted', 'Upload cancelled.'));
      xhr.send(form);
    });
    return { done, abort: () => xhr.abort() };
  },
};
