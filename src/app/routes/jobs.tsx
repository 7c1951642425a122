export { JobsPlaceholder as Component } from '@/features/jobs/components/jobs-placeholder';
