import { redirect } from "react-router";
import type { Route } from "./+types/_index";
import { currentUser } from "~/auth/access.server";
import { ButtonLink } from "~/components/Button";
import { Card } from "~/components/Card";
import { PracticeCare } from "~/components/PracticeCare";

export const meta: Route.MetaFunction = () => [
  { title: "Nearnote · hear what your practice is doing" },
  {
    name: "description",
    content: "Chord-by-chord feedback on keyboard harmony practice, for students and their teachers.",
  },
];

export async function loader({ request, context }: Route.LoaderArgs) {
  if (await currentUser({ request, context })) throw redirect("/home");
  return null;
}

export default function Landing() {
  return (
    <div className="flex flex-col gap-10">
      <section className="grid gap-8 md:grid-cols-[3fr_2fr] md:items-center">
        <div>
          <h1 className="text-3xl font-semibold leading-tight tracking-tight md:text-[2.6rem]">
            Your teacher can't sit beside you every day. Nearnote listens in between.
          </h1>
          <p className="mt-4 max-w-xl text-lg text-ink-soft">
            Play a progression on a MIDI keyboard, send Nearnote the take, and see every chord change laid out: what you
            played, how far each hand travelled, and the shorter path you could have taken.
          </p>
          <div className="mt-6 flex flex-wrap gap-3">
            <ButtonLink to="/signup">Start a studio</ButtonLink>
            <ButtonLink to="/login" variant="secondary">
              Sign in
            </ButtonLink>
          </div>
        </div>
        <ChangeSketch />
      </section>
      <section className="grid gap-5 md:grid-cols-2">
        <Card title="For students">
          <ul className="list-disc space-y-2 pl-5 text-ink-soft">
            <li>Each chord named, with its inversion and whether the voicing is close or open.</li>
            <li>Every change measured in semitones against the smoothest move available.</li>
            <li>Clumsy moves pointed out in plain words, with a better voicing you can hear.</li>
            <li>Your own progress, week by week.</li>
          </ul>
        </Card>
        <Card title="For teachers">
          <ul className="list-disc space-y-2 pl-5 text-ink-soft">
            <li>Set exercises in any key, as chord symbols or Roman numerals.</li>
            <li>Review what was actually played, and comment on the exact change.</li>
            <li>Compare students over the weeks and export progress for families or a school.</li>
          </ul>
        </Card>
      </section>
      <PracticeCare />
    </div>
  );
}

/** A small drawing of two voicings and the steps between them. */
function ChangeSketch() {
  const from = [53, 57, 60];
  const to = [53, 58, 62];
  const y = (n: number) => 150 - (n - 50) * 9;
  return (
    <figure className="rounded-lg border border-line bg-card p-4">
      <svg
        viewBox="0 0 240 160"
        role="img"
        aria-label="F major moving to B flat major over F: three semitones in all"
        className="w-full"
      >
        {from.map((n, i) => (
          <g key={n}>
            <rect x={30} y={y(n) - 5} width={60} height={10} rx={3} fill="#0d6b70" />
            <line x1={92} y1={y(n)} x2={148} y2={y(to[i])} stroke="#9a5b12" strokeDasharray="4 3" strokeWidth={2} />
            <rect x={150} y={y(to[i]) - 5} width={60} height={10} rx={3} fill="#2f6b3d" />
          </g>
        ))}
      </svg>
      <figcaption className="text-center text-sm text-ink-soft">
        F → B♭/F: 0 + 1 + 2 = <strong className="text-ink">3 semitones</strong>, the smoothest move there is.
      </figcaption>
    </figure>
  );
}
