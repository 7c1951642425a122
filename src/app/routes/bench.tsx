export { BenchPlaceholder as Component } from '@/features/bench/components/bench-placeholder';
