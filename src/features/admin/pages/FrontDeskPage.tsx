import { useState } from 'react'
import { Link } from 'react-router-dom'
import { PageHeader } from '../../../components/ui/Card'
import { TabPanel, Tabs } from '../../../components/ui/Tabs'
import type { UnitSystem } from '../../../lib/units'
import { useMe } from '../../auth/api/auth'
import { AccountsTable } from '../components/AccountsTable'
import { DisputeDesk } from '../components/DisputeDesk'
import { StudiosTable } from '../components/StudiosTable'

type DeskTab = 'studios' | 'disputes' | 'accounts'

const TABS: { value: DeskTab; label: string }[] = [
  { value: 'studios', label: 'Studios' },
  { value: 'disputes', label: 'Disputes' },
  { value: 'accounts', label: 'Accounts' },
]

const LEADS: Record<DeskTab, string> = {
  studios: 'Published studios nobody has checked yet come first. Verify once you have seen the kilns and spoken to the owner.',
  disputes: 'Read each dispute’s reason and the record (check-in, firing log, results, photos, messages) before refunding.',
  accounts: 'Suspend an account that abuses the marketplace; its sessions end at once. Restoring it lets it sign in again.',
}

/** The marketplace admin's home: studios to verify, disputes to settle, accounts to keep honest. */
export function FrontDeskPage() {
  const [tab, setTab] = useState<DeskTab>('studios')
  const me = useMe()
  const units: UnitSystem = me.data?.unitSystem ?? 'imperial'
  return (
    <>
      <PageHeader
        title="Front desk"
        lead="Verify studios, settle disputes and keep the marketplace honest."
        actions={
          <Link to="/front-desk/claims" className="font-medium text-clay-700 hover:underline">
            Contested damage claims
          </Link>
        }
      />
      <div className="space-y-5">
        <Tabs label="The desk" idBase="desk" tabs={TABS} value={tab} onChange={setTab} />
        <TabPanel idBase="desk" value={tab} className="space-y-4">
          <p className="max-w-3xl text-sm text-slip-600">{LEADS[tab]}</p>
          {tab === 'studios' && <StudiosTable />}
          {tab === 'disputes' && <DisputeDesk units={units} />}
          {tab === 'accounts' && <AccountsTable />}
        </TabPanel>
      </div>
    </>
  )
}
