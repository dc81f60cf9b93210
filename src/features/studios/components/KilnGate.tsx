import type { ReactNode } from 'react'
import { Alert } from '../../../components/ui/Alert'
import { Badge } from '../../../components/ui/Badge'
import { Spinner } from '../../../components/ui/Spinner'
import { useKiln } from '../api/kilns'
import { useStudio } from '../api/studios'
import { isMemberView, type KilnRecord, type MemberStudio } from '../api/types'
import { ApiProblem } from './ApiProblem'

/**
 * Loads a kiln and its studio for the studio's own pages, and says so plainly when either is
 * missing or the viewer is not one of the studio's people.
 */
export function KilnGate({ kilnId, children }: { kilnId: string; children: (kiln: KilnRecord, studio: MemberStudio) => ReactNode }) {
  const kiln = useKiln(kilnId)
  const studio = useStudio(kiln.data?.studioId)
  if (kiln.isPending || (kiln.isSuccess && studio.isPending)) return <Spinner label="Loading the kiln…" />
  if (kiln.isError) return <ApiProblem error={kiln.error} what="this kiln" />
  if (studio.isError) return <ApiProblem error={studio.error} what="this kiln’s studio" />
  if (!isMemberView(studio.data!)) {
    return (
      <Alert tone="warning" title="This page is for the studio’s own people">
        Potters see the kiln on the studio’s public page.
      </Alert>
    )
  }
  return <>{children(kiln.data, studio.data)}</>
}

/** The kiln's name as a page title, marked when it is retired. */
export function KilnTitle({ kiln }: { kiln: KilnRecord }) {
  return (
    <span className="flex flex-wrap items-center gap-3">
      {kiln.name} {kiln.retired && <Badge>Retired</Badge>}
    </span>
  )
}
