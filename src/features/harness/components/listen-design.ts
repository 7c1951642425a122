// What Listen hears of a design lives in src/components/listen/ (shared by the Harness screen, a saved design's page and a job's page).
export {
  instrumentChainOf,
  listenDesignOf,
  listenInstrumentOf,
  recordingChainOf,
  type ListenInstrument,
} from '@/components/listen/listen-design';
