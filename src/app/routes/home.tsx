import { Link } from 'react-router-dom';
import { LinkButton } from '../../components/button';
import { useSession } from '../../features/auth/api/get-session';
import { paths } from '../paths';
import { ReleaseList } from '../../features/releases/components/release-list';

const steps = [
  { title: 'Deposit', text: 'Upload the trajectories of every individual in a group, as your tracking system wrote them. Cohesia checks each file and computes the field’s standard statistics on arrival.' },
  { title: 'Release', text: 'A curator of your lab publishes a version: immutable, citable, with an identifier of its own and one for all versions.' },
  { title: 'Share', text: 'Open to everyone, on request with your lab’s terms, or under embargo until a date you choose.' },
  { title: 'Compare', text: 'Set polarization, density profiles, effective spring constants and more side by side across labs, species and group sizes.' },
];

export function Component() {
  const session = useSession();
  return (
    <div>
      <section className="border-b border-mist bg-white">
        <div className="mx-auto max-w-4xl px-4 py-14">
          <p className="text-sm font-semibold uppercase tracking-wide text-dusk">Swarms · schools · flocks</p>
          <h1 className="mt-2 text-3xl font-bold leading-tight sm:text-4xl">
            The shared home for trajectory data of animal groups
          </h1>
          <p className="mt-4 max-w-2xl font-serif text-lg leading-relaxed text-ink/85">
            Recording every individual of a swarm or a school takes cameras, calibration and patience. Cohesia lets labs deposit those
            trajectories, release them as citable versions, share them openly or on request, and compare their statistics across groups and species.
          </p>
          <div className="mt-8 flex flex-wrap gap-3">
            {session.data ? (
              <LinkButton to={paths.myLabs}>Go to my labs</LinkButton>
            ) : (
              <>
                <LinkButton to={paths.signUp}>Create an account</LinkButton>
                <LinkButton to={paths.signIn} variant="secondary">Sign in</LinkButton>
              </>
            )}
          </div>
        </div>
      </section>
      <section className="mx-auto max-w-4xl px-4 pt-10">
        <div className="mb-4 flex flex-wrap items-baseline justify-between gap-2">
          <h2 className="text-xl font-bold">Recent releases</h2>
          <Link to={paths.catalogue} className="text-sm">Search the whole catalogue →</Link>
        </div>
        <ReleaseList />
      </section>
      <section className="mx-auto grid max-w-4xl gap-6 px-4 py-12 sm:grid-cols-2">
        {steps.map((s, i) => (
          <div key={s.title}>
            <h2 className="text-lg font-bold"><span className="mr-2 text-dusk tabular-nums">{i + 1}.</span>{s.title}</h2>
            <p className="mt-2 leading-relaxed text-ink/80">{s.text}</p>
          </div>
        ))}
      </section>
    </div>
  );
}
