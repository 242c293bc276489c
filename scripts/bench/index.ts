/** The throughput and latency bench behind `npm run bench` (entry: scripts/bench/main.ts). */
export { startBareExpress } from './bareExpress';
export { DEFAULT_OPTIONS, readBenchOptions, USAGE, type BenchOptions } from './options';
export { figuresOf, formatReport, TARGETS } from './report';
export { runBench, type BenchResult } from './run';
