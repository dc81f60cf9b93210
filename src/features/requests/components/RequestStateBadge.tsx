import type { RequestState } from '../../../../shared/workflow/request-states'
import { Badge } from '../../../components/ui/Badge'
import { STATE_TONES, stateLabel } from '../requestWords'

export function RequestStateBadge({ state }: { state: RequestState }) {
  return (
    <span data-testid="request-state" data-state={state}>
      <Badge tone={STATE_TONES[state]}>{stateLabel(state)}</Badge>
    </span>
  )
}
