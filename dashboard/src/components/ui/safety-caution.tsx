/**
 * The cautions shown beside every verdict and on every measurement page. Headroom's figures are
 * engineering estimates from measurements; the people and the rules on site decide.
 */
const DEFAULT_CAUTIONS = [
  'Work on or near energised circuits is for qualified persons, with the right PPE and an instrument rated for the measurement category.',
  "These are engineering estimates from the recorded traces and the device's published limits, not a guarantee that a device will or will not trip.",
  'Local codes and the authority having jurisdiction decide; a licensed electrician signs off any change.',
];

/** `items` replaces the general cautions with more specific ones (e.g. those a check answered with). */
export function SafetyCaution({ compact = false, items }: { compact?: boolean; items?: string[] }) {
  const list = items && items.length > 0 ? items : DEFAULT_CAUTIONS;
  return (
    <aside
      aria-label="Safety cautions"
      className="rounded-lg border-l-4 border-amber-500 bg-amber-50 px-4 py-3 text-sm text-ink-900"
    >
      <p className="font-semibold">Before you act on this</p>
      <ul className={`mt-1 list-disc space-y-0.5 pl-5 ${compact ? 'text-xs' : ''}`}>
        {list.map((text) => (
          <li key={text}>{text}</li>
        ))}
      </ul>
    </aside>
  );
}
