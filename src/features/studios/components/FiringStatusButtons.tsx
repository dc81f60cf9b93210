import { useState, type ReactNode } from 'react'
import type { FiringStatus } from '../../../../shared/workflow/firing-status'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { useUpdateFiring } from '../api/firings'
import type { FiringRecord } from '../api/types'

type Move = Exclude<FiringStatus, 'cancelled'>

/** What the studio does to move a firing on, in its words. */
export const STATUS_ACTIONS: Record<Move, string> = {
  open: 'Take ware again',
  full: 'Mark full',
  closed: 'Stop taking ware',
  loading: 'Start loading',
  firing: 'Kiln is firing',
  cooling: 'Kiln is cooling',
  unloaded: 'Kiln unloaded',
}

/** What a move does to the requests in the firing, said before it is made. */
const CONSEQUENCES: Partial<Record<Move, string>> = {
  loading:
    'Requests whose ware was never dropped off lapse as no-shows and are refunded under your terms. The firing can only move forward after this.',
  unloaded: 'Every checked-in request is marked fired, and each potter gets a mail. Post results on each request next.',
}

interface FiringStatusButtonsProps {
  firing: FiringRecord
  /** Drawn after the moves, e.g. the cancel button of the calendar's dialog. */
  children?: ReactNode
}

/**
 * The status moves the firing allows now. Loading and unloading move every request in the firing,
 * so they ask once more before going ahead.
 */
export function FiringStatusButtons({ firing, children }: FiringStatusButtonsProps) {
  const update = useUpdateFiring(firing.studioId)
  const [confirming, setConfirming] = useState<Move | null>(null)
  const moves = firing.nextStatuses.filter((s): s is Move => s !== 'cancelled')
  const move = (status: Move) => update.mutate({ firingId: firing.id, body: { status } }, { onSuccess: () => setConfirming(null) })
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap gap-2" role="group" aria-label="Change status">
        {moves.map((status) => (
          <Button
            key={status}
            variant={status === 'loading' || status === 'firing' || status === 'cooling' || status === 'unloaded' ? 'primary' : 'secondary'}
            size="sm"
            busy={update.isPending && update.variables?.body.status === status}
            disabled={update.isPending}
            onClick={() => (CONSEQUENCES[status] ? setConfirming(status) : move(status))}
          >
            {STATUS_ACTIONS[status]}
          </Button>
        ))}
        {children}
      </div>
      {confirming && (
        <div className="space-y-2 rounded-control border border-ember-300 bg-ember-100/40 p-3" data-testid="status-confirm">
          <p className="text-sm text-slip-800">{CONSEQUENCES[confirming]}</p>
          <div className="flex flex-wrap gap-2">
            <Button size="sm" busy={update.isPending} onClick={() => move(confirming)}>
              {STATUS_ACTIONS[confirming]}: go ahead
            </Button>
            <Button size="sm" variant="ghost" onClick={() => setConfirming(null)}>
              Not yet
            </Button>
          </div>
        </div>
      )}
      {update.isError && <Alert tone="danger">{update.error.message}</Alert>}
    </div>
  )
}
