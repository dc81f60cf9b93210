import { PhotoGallery } from '../../../components/photos/PhotoGallery'
import { PhotoUploader } from '../../../components/photos/PhotoUploader'
import { useRefreshPhotos } from '../api/pickup'
import type { RequestView } from '../api/types'

/** States in which the ware is still the potter's to photograph: up to the drop-off. */
const BEFORE_DROP_OFF: readonly RequestView['state'][] = ['draft', 'sent', 'accepted', 'deposit_paid']

export const potterMayAddWarePhotos = (view: Pick<RequestView, 'viewer' | 'state'>) =>
  view.viewer !== 'studio' && BEFORE_DROP_OFF.includes(view.state)

/** The potter's own photos of the ware: the studio sees what is coming before it arrives. */
export function WarePhotos({ view }: { view: RequestView }) {
  const refreshPhotos = useRefreshPhotos(view.id)
  const mayAdd = potterMayAddWarePhotos(view)
  const potter = view.viewer !== 'studio'
  return (
    <div className="space-y-4" data-testid="ware-photos">
      <PhotoGallery
        photos={view.photos}
        kinds={['ware']}
        headings={{ ware: potter ? 'Your photos' : 'From the potter' }}
        empty={
          potter
            ? mayAdd
              ? 'No photos yet. A photo or two helps the studio see the ware before it arrives.'
              : 'You added no photos.'
            : 'The potter added no photos of the ware.'
        }
      />
      {mayAdd && (
        <PhotoUploader
          uploadUrl={`/api/requests/${view.id}/photos`}
          fields={{ kind: 'ware' }}
          label="Photos of your ware"
          hint="The glazed feet and any runny glaze are most useful to the studio."
          onUploaded={() => void refreshPhotos()}
        />
      )}
    </div>
  )
}
