import { lazy, Suspense, type ComponentType, type LazyExoticComponent } from 'react';
import { Navigate } from 'react-router-dom';
import { ButtonLink } from '../components/button';
import { Card, Loading, Page } from '../components/page';
import { Link } from 'react-router-dom';
import { homeCards, type HomeCard } from './home-cards';
import { homePathFor } from './nav';
import { useSessionUser } from './role-guard';

const lazyCards = new Map<string, LazyExoticComponent<ComponentType>>();
function cardComponent(card: HomeCard): LazyExoticComponent<ComponentType> | undefined {
  if (!card.component) return undefined;
  let found = lazyCards.get(card.id);
  if (!found) {
    const load = card.component;
    found = lazy(async () => ({ default: (await load()).Component }));
    lazyCards.set(card.id, found);
  }
  return found;
}

const greeting: Record<string, string> = {
  setter: 'Your tilings, their progress through review, and what you have earned.',
  editor: 'What needs your attention on the desk today.',
  admin: 'What needs attention on the desk, and the people who use it.',
};

/** '/' : the role's Home, made of the cards in home-cards.tsx. Roles without a Home (printer) go to their first page. */
export function HomePage() {
  const user = useSessionUser();
  const first = homePathFor(user.role);
  if (first !== '/') return <Navigate to={first} replace />;
  const cards = homeCards.filter((c) => c.roles.includes(user.role));
  const firstName = (user.name || user.email).split(/\s+/)[0];
  return (
    <Page
      title={`Good to see you, ${firstName}`}
      description={greeting[user.role]}
      actions={
        user.role === 'setter' ? (
          <ButtonLink to="/submit" variant="primary">
            Submit a tiling
          </ButtonLink>
        ) : (
          <ButtonLink to="/review" variant="primary">
            Open the review queue
          </ButtonLink>
        )
      }
    >
      <div className="grid gap-4 sm:grid-cols-2 xl:grid-cols-3">
        {cards.map((card) => {
          const Live = cardComponent(card);
          return (
            <Card
              key={card.id}
              title={card.title}
              footer={card.link ? <Link to={card.link.to}>{card.link.label} →</Link> : undefined}
            >
              {Live ? (
                <Suspense fallback={<Loading />}>
                  <Live />
                </Suspense>
              ) : (
                <p className="text-sm text-ink-muted">{card.description}</p>
              )}
            </Card>
          );
        })}
      </div>
    </Page>
  );
}
