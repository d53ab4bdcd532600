// The bench's public interface (plain TypeScript: no framework or database import). The bench API
// (lib/server/bench.ts), the isolation check and the practice scoring all go through this module.
export * from '@/lib/bench/points';
export { FAULTS, FAULT_IDS, getFault, faultFits, type Fault, type FaultEffect } from '@/lib/bench/faults';
export {
  createBench,
  BenchRefusal,
  DEFAULT_BENCH_UNIT,
  MAX_WAIT_SECONDS,
  type Bench,
  type BenchSnapshot,
  type BenchStatus,
  type BenchUnit,
  type CreateBenchOptions,
  type MeasureRequest,
  type Reading,
} from '@/lib/bench/bench';
