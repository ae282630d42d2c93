/** The plain statement that results are a screening aid. Shown wherever a result could mislead. */
export function Caution({ compact = false }: { compact?: boolean }) {
  return (
    <p className={compact ? 'caution caution-compact' : 'caution'} role="note">
      <strong>Screening aid.</strong> Results are for steady two-dimensional heat flow under the stated conditions. Mould and condensation also depend on air
      leakage, moisture sources and time. Frost protection, radon, foam plastics that need a thermal barrier, drainage and waterproofing, and structure are
      outside this check: local codes, manufacturers&apos; instructions and licensed professionals govern.
    </p>
  );
}
