// Lugbook's safety notes, each saying what is safe where the work happens: entering readings
// (the bench and a part's page), measuring ESR (amplifier capacitors), installing a part in a job,
// and the Harness screen (which predicts; the wiring itself is soldered by hand). The words live
// here once, so every screen says the same thing. Quiet, not alarming.

const WarnIcon = () => (
  <svg viewBox="0 0 16 16" className="size-4 shrink-0 text-marginal" aria-hidden="true">
    <path d="M8 1.5 15 14.5H1z" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinejoin="round" />
    <path d="M8 6v4M8 11.8v.4" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round" />
  </svg>
);

/** The notes' sentences, also read by the tests that check each note is shown. */
export const SAFETY_WORDS = {
  measure: 'Measure parts out of circuit with nothing powered: unplug the guitar or bass from any amplifier, and the meter from the mains.',
  valve: 'Valve amplifiers keep lethal voltages after they are switched off, until a qualified person has discharged their capacitors.',
  qualified:
    'Leave mains and amplifier work to qualified technicians (licensed where your local rules require it) and follow your local electrical codes.',
  solder:
    'Soldering: the iron and fresh joints burn, so use a stand and let joints cool; wear eye protection; ventilate the fumes; wash your hands after handling lead-bearing solder.',
  solvents: 'Solvents and contact cleaners: ventilate, keep them away from the hot iron and flames, and wear gloves.',
  esr: 'ESR is measured on capacitors taken from amplifiers: have them discharged by a qualified person before they reach the bench, and check with a meter that they read near 0 V before touching the leads.',
  install:
    'Install with the instrument unplugged from any amplifier; solder with eye protection and ventilation, and let the iron rest in its stand.',
  harness:
    'These curves are computed, not measured on a powered circuit: wire the harness with the instrument unplugged, solder with eye protection and ventilation, and leave amplifier work to qualified technicians.',
} as const;

function Line({ id, children, className }: { id?: string; children: string; className?: string }) {
  return (
    <p id={id} className={`flex items-start gap-1.5 text-xs text-ink-soft ${className ?? ''}`}>
      <WarnIcon />
      <span>
        <span className="font-medium text-ink">Safety:</span> {children}
      </span>
    </p>
  );
}

/** Where readings are entered: a panel beside the Bench form, one line under a part page's form. */
export function BenchSafetyNote({ className, compact }: { className?: string; compact?: boolean }) {
  if (compact) {
    return <Line className={className}>{`${SAFETY_WORDS.measure} ${SAFETY_WORDS.valve} ${SAFETY_WORDS.qualified}`}</Line>;
  }
  return (
    <aside
      aria-labelledby="bench-safety-heading"
      className={`rounded-lg border border-paper-edge bg-paper-deep/60 p-4 text-sm text-ink-soft ${className ?? ''}`}
    >
      <h2 id="bench-safety-heading" className="mb-1.5 flex items-center gap-1.5 text-sm font-semibold text-ink">
        <WarnIcon />
        At the bench
      </h2>
      <ul className="list-disc space-y-1 pl-4">
        <li>{SAFETY_WORDS.measure}</li>
        <li>{SAFETY_WORDS.valve}</li>
        <li>{SAFETY_WORDS.qualified}</li>
        <li>{SAFETY_WORDS.solder}</li>
        <li>{SAFETY_WORDS.solvents}</li>
      </ul>
    </aside>
  );
}

/** Beside the ESR quantity of the reading form. */
export function EsrDischargeNote({ id, className }: { id?: string; className?: string }) {
  return (
    <Line id={id} className={className}>
      {SAFETY_WORDS.esr}
    </Line>
  );
}

/** On a job's Install form. */
export function InstallSafetyNote({ className }: { className?: string }) {
  return <Line className={className}>{SAFETY_WORDS.install}</Line>;
}

/** On the Harness screen. */
export function HarnessSafetyNote({ className }: { className?: string }) {
  return <Line className={className}>{SAFETY_WORDS.harness}</Line>;
}
