import { Link } from 'react-router';
import type { Role } from '@shared/roles.ts';
import { ROLE_LABELS } from '@shared/roles.ts';
import { useMe } from '@/features/auth/api/get-me.ts';
import { NAV } from '@/config/nav.ts';
import { Page, Card } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { PortalSummaryPanel } from '@/features/portal/components/portal-summary.tsx';

/** What each role can do here today: only work that has a screen. */
const INTRO: Record<Role, string> = {
  admin: 'Look after who can sign in, with which role and for which company.',
  purchasing: 'Keep the catalogue complete (parts, prices, costs and supplier codes) and the ranges’ BOM rules current.',
  warehouse: 'Find any part by name, code or barcode, and see its stock in each warehouse.',
  sales: 'Find parts and plan battery systems for every trade account, and keep their draft plans.',
  installer: 'Plan battery systems for your sites, order them, pay for them and follow each job until the kit is in your hands.',
};

export function HomeRoute() {
  const { data: me } = useMe();
  if (!me) return null;
  const first = me.user.name.split(' ')[0];
  const links = NAV.filter((i) => i.href !== '/' && (!i.needs || me.abilities.includes(i.needs)));
  return (
    <Page title={`Good to see you, ${first}`} subtitle={`${ROLE_LABELS[me.role]}${me.company ? ` · ${me.company.name}` : ''}`}>
      <p className="mb-4 max-w-2xl text-ink-soft" data-testid="home-intro">
        {INTRO[me.role]}
      </p>
      {me.role === 'installer' && (
        <div className="mb-6">
          <PortalSummaryPanel />
        </div>
      )}
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
        {links.map((l) => (
          <Link key={l.href} to={l.href} className="block">
            <Card className="h-full hover:border-copper">
              <h2 className="font-semibold">{l.label}</h2>
              {l.blurb && <p className="mt-1 text-sm text-ink-soft">{l.blurb}</p>}
            </Card>
          </Link>
        ))}
      </div>
      {me.role === 'installer' && (
        <div className="mt-6 max-w-2xl">
          <Notice tone="caution" title="Battery installation is licensed electrical work">
            Plans in Stackyard are for quoting and ordering. Install to AS/NZS 5139, AS/NZS 3000, the maker’s manual and your local rules.
          </Notice>
        </div>
      )}
    </Page>
  );
}
