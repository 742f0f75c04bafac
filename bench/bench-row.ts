export interface BenchRow { name: string; seconds: number; reference?: string; ratio?: number; note?: string }
