// Kit sales of a build: the figures (cost-based ones reach the owner only), attributed lines page by
// page, the remembered column mapping, and the import of a store export through XMLHttpRequest so the
// upload has a real progress figure.
import { api, qs, ApiError } from './http';
import type { Attribution } from '@shared/sales';
import type { SalesSummarySeen, SalesLinesSeen, SalesImportReport, SalesMappingAnswer } from '@shared/contracts/sales';
import type { SalesMapping } from '@shared/schemas/sales';

export type { Attribution } from '@shared/sales';
export type { SalesMapping } from '@shared/schemas/sales';
export type { SalesImportReport, SalesProblem } from '@shared/contracts/sales';
/** The figures as a screen holds them: cost-based ones only when sent (the owner's). */
export type SalesSummary = SalesSummarySeen;
export type { SalesLineSeen as SalesLineRecord } from '@shared/contracts/sales';
export type SalesLinesPage = SalesLinesSeen;

/** The most the server takes in one file (its CSV body limit). */
export const SALES_MAX_BYTES = 10 * 1024 * 1024;

const base = (buildId: number | string) => `/api/builds/${buildId}/sales`;

export const salesApi = {
  summary: (buildId: number | string) => api.get<SalesSummary>(base(buildId)),
  lines: (buildId: number | string, q: { kind: Attribution; page: number; pageSize: number }) =>
    api.get<SalesLinesPage>(`${base(buildId)}/lines${qs(q)}`),
  mapping: (buildId: number | string) => api.get<SalesMappingAnswer>(`${base(buildId)}/mapping`),

  /**
   * Sends the file for a preview (dryRun) or the import. `onProgress` gets 0…1 as the bytes leave the
   * browser; the promise settles with the server's report (a refused file answers its report too).
   */
  importFile(
    buildId: number,
    text: string,
    opts: { dryRun: boolean; mapping: SalesMapping; fileName: string },
    onProgress: (fraction: number) => void,
  ): Promise<SalesImportReport> {
    return new Promise((resolve, reject) => {
      const xhr = new XMLHttpRequest();
      xhr.open(
        'POST',
        `${base(buildId)}/import${qs({ dryRun: opts.dryRun ? 1 : 0, fileName: opts.fileName, mapping: JSON.stringify(opts.mapping) })}`,
      );
      xhr.setRequestHeader('X-Requested-With', 'Bayslate');
      xhr.setRequestHeader('Accept', 'application/json');
      xhr.setRequestHeader('Content-Type', 'text/csv');
      xhr.responseType = 'json';
      xhr.upload.onprogress = (e) => {
        if (e.lengthComputable) onProgress(e.loaded / e.total);
      };
      xhr.onload = () => {
        const body = (xhr.response ?? {}) as SalesImportReport & {
          error?: { code?: string; message?: string; fields?: { path: string; message: string }[] };
        };
        if ((xhr.status === 200 || xhr.status === 201) && Array.isArray(body.errors)) return resolve(body);
        if (xhr.status === 400 && body.error?.code === 'bad_csv' && Array.isArray(body.errors)) return resolve(body);
        const fallback =
          xhr.status === 413
            ? 'The file is larger than the server takes (10 MB); split it and import the parts one after the other.'
            : `The server answered ${xhr.status}.`;
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
      xhr.send(text);
    });
  },
};
