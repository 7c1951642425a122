export { HarnessPlaceholder as Component } from '@/features/harness/components/harness-placeholder';
