export declare const ROOT: string;
export declare const PREBUILT_DIR: string;
export declare const MANIFEST_NAME: string;
export declare const PREBUILT_ENTRIES: Record<'cli' | 'worker-main' | 'processor' | 'engine-thread', string>;
export type PrebuiltName = keyof typeof PREBUILT_ENTRIES;
export interface ManifestEntry {
  /** The bundle's file name inside the prebuilt folder. */
  output: string;
  /** Every source file bundled, relative to the root, with its [size, mtimeMs] at build. */
  inputs: Record<string, [number, number]>;
}
export interface Manifest {
  root: string;
  entries: Partial<Record<PrebuiltName, ManifestEntry>>;
}
export declare function readManifest(dir?: string): Manifest | null;
export declare function prebuiltPath(name: PrebuiltName, dir?: string): string | null;
export declare function importEntry(name: PrebuiltName): Promise<unknown>;
