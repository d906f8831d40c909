/** The short, friendly caution every practice screen carries. */
export function PracticeCare() {
  return (
    <aside
      aria-label="Looking after your hands"
      className="rounded-md border border-line bg-card px-4 py-3 text-sm text-ink-soft"
    >
      <strong className="text-ink">Look after your hands.</strong> Take a short break every 20–30 minutes, shake out
      your wrists and forearms, and stop if anything hurts. Pain that comes back is a reason to talk to your teacher and
      to see a qualified clinician. Nearnote's figures are practice aids, not a verdict on your musicianship.
    </aside>
  );
}
