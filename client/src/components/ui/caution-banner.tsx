/** The standing caution on every page that shows results. */
export function CautionBanner() {
  return (
    <aside aria-label="How to read these results" className="mb-6 rounded-md border border-rule bg-accent-50 px-5 py-3 text-sm text-ink-700">
      <strong className="font-medium text-ink-900">How to read these results.</strong> Estimates describe applicants with scores near the
      cutoff and, for participation effects, only those who take part because they qualify. They do not judge any individual. Decisions
      follow your agency&rsquo;s evaluation standards, data-protection rules and local law.
    </aside>
  );
}
