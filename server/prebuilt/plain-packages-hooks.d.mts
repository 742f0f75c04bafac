export interface LoadResult {
  format?: string | null;
  source?: string | ArrayBuffer | Uint8Array;
  shortCircuit?: boolean;
}

/** Loads the packages kept away from the TypeScript loader with Node's own loader; passes everything else on. */
export declare function load(url: string, context: { format?: string | null }, nextLoad: (url: string, context?: object) => Promise<LoadResult>): Promise<LoadResult>;
