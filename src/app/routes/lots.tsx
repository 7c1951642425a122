export { LotsPlaceholder as Component } from '@/features/lots/components/lots-placeholder';
