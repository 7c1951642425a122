export { ComparePlaceholder as Component } from '@/features/compare/components/compare-placeholder';
