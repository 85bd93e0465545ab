// Types of compress-static.mjs, for the TypeScript that imports it (bench/lighthouse).

/** One compressed file: its path under the folder and its sizes in bytes (`raw` where no copy was kept). */
export interface CompressedFile {
  readonly path: string;
  readonly raw: number;
  readonly gzip: number;
  readonly brotli: number;
}

export function compressStatic(dir: string): Promise<CompressedFile[]>;
export function printTable(rows: readonly CompressedFile[]): void;
