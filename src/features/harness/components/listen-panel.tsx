// The Listen panel lives in src/components/listen/ (the Harness screen, a saved design's page and a job's page use it).
export { ListenPanel, type ListenPanelProps } from '@/components/listen/listen-panel';
