import { Link } from 'react-router-dom';
import type { UserDto } from '@shared/schemas/auth.schema';
import { Card } from '@/components/ui/page-header';
import { QueryError } from '@/components/ui/query-error';
import { PageSpinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { useAthlete } from '@/features/athletes/api/get-athlete';
import { useAthletes } from '@/features/athletes/api/get-athletes';
import { ConsentBadge } from '@/features/athletes/components/consent-badge';
import { ConsentCard } from '@/features/athletes/components/consent-card';
import { SeasonPlanPanel } from '@/features/season-plan/components/season-plan-panel';
import { ReviewList } from '@/features/reviews/components/review-list';
import { useClips } from '@/features/clips/api/get-clips';
import { ClipList } from '@/features/clips/components/clip-list';
import { FlagInbox } from '@/features/flags/components/flag-inbox';
import { HomeGreeting } from '@/features/home/components/home-greeting';
import { StatTile } from '@/features/home/components/stat-tile';
import { useSessions } from '@/features/sessions/api/get-sessions';
import { useUser } from '@/lib/auth';
import { formatDay } from '@/lib/format';
import { can } from '@/lib/permissions';
import { HomeOrLanding } from '../guards';

/** The head coach's and a coach's inbox: flags of the groups they coach (the head coach: all). */
function FlagsToReview({ user }: { user: UserDto }) {
  return (
    <Card title="Flags to review">
      <p className="mb-2 text-sm text-granite-600">
        One item per habit and turn outside its age-group band, newest first.{' '}
        <Link className="text-glacier-700 hover:underline" to={paths.tolerances.href()}>
          Set the bands
        </Link>
      </p>
      <FlagInbox
        canReview={can(user.role, 'flags.review')}
        emptyText="No value of your athletes' analysed clips is outside its band. New flags appear here after clips are analysed or a band changes."
      />
    </Card>
  );
}

function CoachHome({ user }: { user: UserDto }) {
  const clips = useClips();
  return (
    <>
      <HomeGreeting user={user} title="Home" />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <FlagsToReview user={user} />
        <section aria-label="Latest clips">
          <h2 className="mb-3 text-base font-semibold text-granite-900">Latest clips of your athletes</h2>
          {clips.isError ? (
            <QueryError error={clips.error} what="clips" retry={() => void clips.refetch()} />
          ) : null}
          {clips.isPending ? <PageSpinner label="Loading clips" /> : null}
          {clips.data ? (
            <ClipList clips={clips.data.slice(0, 4)} emptyText="Clips appear here once you upload them." />
          ) : null}
        </section>
      </div>
    </>
  );
}

function ClubOverview({ user }: { user: UserDto }) {
  const athletes = useAthletes();
  const sessions = useSessions();
  const clips = useClips();
  const missing = (athletes.data?.athletes ?? []).filter((a) => a.consent.status === 'missing');

  return (
    <>
      <HomeGreeting user={user} title="Home" />
      <div className="mb-6 grid gap-4 sm:grid-cols-3">
        <StatTile label="Athletes" value={athletes.data?.athletes.length} to={paths.athletes.href()} />
        <StatTile label="Sessions" value={sessions.data?.length} to={paths.sessions.href()} />
        <StatTile
          label="Consent missing"
          value={athletes.data ? missing.length : undefined}
          to={paths.athletes.href()}
          note="Under-18s whose clips cannot be stored yet"
        />
      </div>
      <div className="mb-6">
        <FlagsToReview user={user} />
      </div>
      <div className="grid gap-6 lg:grid-cols-2">
        <Card title="Waiting for guardian consent">
          {athletes.isError ? <QueryError error={athletes.error} what="athletes" /> : null}
          {athletes.isPending ? <PageSpinner label="Loading athletes" /> : null}
          {athletes.data && missing.length === 0 ? (
            <p className="text-sm text-granite-600">Every under-18 athlete has recorded consent.</p>
          ) : null}
          <ul className="divide-y divide-granite-100 text-sm">
            {missing.map((athlete) => (
              <li key={athlete.id} className="flex items-center justify-between gap-2 py-2">
                <Link
                  className="font-medium text-glacier-700 hover:underline"
                  to={paths.athlete.href(athlete.id)}
                >
                  {athlete.firstName} {athlete.lastName}
                </Link>
                <span className="flex items-center gap-2 text-granite-600">
                  {athlete.ageGroup.name} <ConsentBadge status={athlete.consent.status} />
                </span>
              </li>
            ))}
          </ul>
        </Card>
        <Card title="Recent sessions">
          {sessions.isError ? <QueryError error={sessions.error} what="sessions" /> : null}
          {sessions.isPending ? <PageSpinner label="Loading sessions" /> : null}
          {sessions.data?.length === 0 ? <p className="text-sm text-granite-600">No sessions yet.</p> : null}
          <ul className="divide-y divide-granite-100 text-sm">
            {(sessions.data ?? []).slice(0, 5).map((session) => (
              <li key={session.id} className="flex items-center justify-between gap-2 py-2">
                <Link
                  className="font-medium text-glacier-700 hover:underline"
                  to={paths.session.href(session.id)}
                >
                  {formatDay(session.date)}
                </Link>
                <span className="truncate text-granite-600">
                  {session.venue} · {session.clipCount} {session.clipCount === 1 ? 'clip' : 'clips'}
                </span>
              </li>
            ))}
          </ul>
        </Card>
      </div>
      <h2 className="mt-8 mb-3 text-base font-semibold text-granite-900">Latest clips</h2>
      {clips.isError ? (
        <QueryError error={clips.error} what="clips" retry={() => void clips.refetch()} />
      ) : null}
      {clips.isPending ? <PageSpinner label="Loading clips" /> : null}
      {clips.data ? (
        <ClipList clips={clips.data.slice(0, 6)} emptyText="Clips appear here once coaches upload them." />
      ) : null}
    </>
  );
}

/** The athlete's own consent and data, below their clips. */
function MyConsent({ athleteId, user }: { athleteId: string; user: UserDto }) {
  const athlete = useAthlete(athleteId);
  if (athlete.isError) return <QueryError error={athlete.error} what="your record" />;
  return athlete.data ? <ConsentCard athlete={athlete.data.athlete} user={user} /> : null;
}

function MyClips({ user }: { user: UserDto }) {
  const clips = useClips(user.athleteId ? { athleteId: user.athleteId } : {});
  return (
    <>
      <HomeGreeting user={user} title="My clips" />
      <section aria-labelledby="my-reviews" className="mb-8">
        <h2 id="my-reviews" className="mb-3 text-base font-semibold text-granite-900">
          My reviews
        </h2>
        <ReviewList emptyText="Your coach has not shared a review yet; it arrives by e-mail too." />
      </section>
      {user.athleteId ? (
        <section aria-labelledby="my-plan" className="mb-8">
          <h2 id="my-plan" className="mb-3 text-base font-semibold text-granite-900">
            My season plan
          </h2>
          <SeasonPlanPanel
            athleteId={user.athleteId}
            firstName={user.name.split(' ')[0]}
            self
            listClips={false}
          />
        </section>
      ) : null}
      {clips.isPending ? <PageSpinner label="Loading your clips" /> : null}
      {clips.isError ? (
        <QueryError error={clips.error} what="your clips" retry={() => void clips.refetch()} />
      ) : null}
      {clips.data ? (
        <ClipList
          clips={clips.data}
          emptyTitle="No clips of you yet"
          emptyText="Your coach uploads clips after training; they show up here."
        />
      ) : null}
      {user.athleteId ? (
        <div className="mt-8">
          <MyConsent athleteId={user.athleteId} user={user} />
        </div>
      ) : null}
    </>
  );
}

function ChildSection({ athleteId, user }: { athleteId: string; user: UserDto }) {
  const athlete = useAthlete(athleteId);
  const clips = useClips({ athleteId });
  const name = athlete.data
    ? `${athlete.data.athlete.firstName} ${athlete.data.athlete.lastName}`
    : 'Your child';
  return (
    <section aria-label={name} className="space-y-3">
      <div className="flex flex-wrap items-center gap-3">
        <h2 className="text-lg font-semibold text-granite-900">{name}</h2>
        {athlete.data ? (
          <>
            <span className="text-sm text-granite-600">{athlete.data.athlete.ageGroup.name}</span>
            <ConsentBadge status={athlete.data.athlete.consent.status} />
          </>
        ) : null}
      </div>
      {athlete.isError ? <QueryError error={athlete.error} what={`the record of ${name}`} /> : null}
      <section>
        <h3 className="mb-2 text-sm font-semibold text-granite-900">Reviews</h3>
        <ReviewList athleteId={athleteId} emptyText="No review shared yet." />
      </section>
      {athlete.data ? (
        <section>
          <h3 className="mb-2 text-sm font-semibold text-granite-900">Season plan</h3>
          <SeasonPlanPanel
            athleteId={athleteId}
            firstName={athlete.data.athlete.firstName}
            listClips={false}
          />
        </section>
      ) : null}
      {clips.isPending ? <PageSpinner label="Loading clips" /> : null}
      {clips.isError ? (
        <QueryError error={clips.error} what="clips" retry={() => void clips.refetch()} />
      ) : null}
      {clips.data ? (
        <ClipList
          clips={clips.data}
          emptyTitle="No clips yet"
          emptyText={
            athlete.data?.athlete.consent.status === 'withdrawn'
              ? 'Consent is withdrawn: clips and reviews are hidden until they are erased or consent is restored.'
              : 'Clips appear here after training.'
          }
        />
      ) : null}
      {athlete.data ? <ConsentCard athlete={athlete.data.athlete} user={user} /> : null}
    </section>
  );
}

function GuardianHome({ user }: { user: UserDto }) {
  return (
    <>
      <HomeGreeting user={user} title="Home" />
      {user.childAthleteIds.length === 0 ? (
        <p className="text-sm text-granite-600">
          No athlete is linked to your sign-in yet. Ask your child&apos;s coach to link you.
        </p>
      ) : (
        <div className="space-y-10">
          {user.childAthleteIds.map((id) => (
            <ChildSection key={id} athleteId={id} user={user} />
          ))}
        </div>
      )}
    </>
  );
}

export function HomePage() {
  const user = useUser();
  return (
    <HomeOrLanding>
      {user.role === 'athlete' ? (
        <MyClips user={user} />
      ) : user.role === 'guardian' ? (
        <GuardianHome user={user} />
      ) : user.role === 'coach' ? (
        <CoachHome user={user} />
      ) : (
        <ClubOverview user={user} />
      )}
    </HomeOrLanding>
  );
}
