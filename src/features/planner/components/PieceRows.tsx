import { useFieldArray, useWatch } from 'react-hook-form'
import { Button } from '../../../components/ui/Button'
import { Checkbox, Field, Select, TextInput } from '../../../components/ui/Field'
import { newPiece } from '../plannerForm'
import { COUNT, lengthMeasure } from '../units'
import { pieceRowId } from './CheckResults'
import { ConeField } from './ConeField'
import type { FormSectionProps } from './sectionProps'
import { FormSection } from './FormSection'
import { MeasureField } from './MeasureField'

export function PieceRows(props: FormSectionProps) {
  const { control, messages } = props
  const { fields, append, remove } = useFieldArray({ control, name: 'pieces' })
  return (
    <FormSection
      title="Pieces"
      lead="One row per kind of piece; sizes are the outside of the piece as it will sit on the shelf."
    >
      <div className="space-y-4">
        {fields.map((field, index) => (
          <PieceRow key={field.id} index={index} onRemove={() => remove(index)} {...props} />
        ))}
        {messages.pieces && (
          <p className="text-sm font-medium text-danger-700" role="alert">
            {messages.pieces}
          </p>
        )}
        <Button variant="secondary" onClick={() => append(newPiece())}>
          Add a piece
        </Button>
      </div>
    </FormSection>
  )
}

function PieceRow({ control, register, messages, units, index, onRemove }: FormSectionProps & { index: number; onRemove: () => void }) {
  const piece = useWatch({ control, name: `pieces.${index}` })
  const length = lengthMeasure(units)
  const shared = { control, messages }
  const at = `pieces.${index}` as const
  const title = `Piece ${index + 1}`

  return (
    <fieldset id={pieceRowId(index)} className="scroll-mt-4 rounded-control border border-slip-200 p-4">
      <legend className="px-1 text-sm font-semibold text-slip-800">{title}</legend>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
        <Field label="Label" hint="Optional: how findings name it." error={messages[`${at}.label`]} className="sm:col-span-2 lg:col-span-2">
          {(a11y) => <TextInput {...a11y} placeholder={title} {...register(`${at}.label`)} />}
        </Field>
        <MeasureField {...shared} name={`${at}.quantity`} label="How many" measure={COUNT} />
        <MeasureField {...shared} name={`${at}.heightMm`} label="Height" measure={length} />
        <MeasureField {...shared} name={`${at}.widthMm`} label={piece.round ? 'Diameter' : 'Width'} measure={length} />
        {!piece.round && <MeasureField {...shared} name={`${at}.depthMm`} label="Depth" measure={length} />}
        <MeasureField {...shared} name={`${at}.wallThicknessMm`} label="Wall thickness" measure={length} />
        <div className="flex items-end pb-2">
          <Checkbox label="Round" {...register(`${at}.round`)} />
        </div>
      </div>

      <div className="mt-3 grid gap-3 sm:grid-cols-3">
        <Field label="Clay body" error={messages[`${at}.clay.body`]}>
          {(a11y) => (
            <Select {...a11y} {...register(`${at}.clay.body`)}>
              <option value="earthenware">Earthenware</option>
              <option value="stoneware">Stoneware</option>
              <option value="porcelain">Porcelain</option>
              <option value="other">Other</option>
            </Select>
          )}
        </Field>
        <ConeField register={register} messages={messages} name={`${at}.clay.minCone`} label="Clay matures from cone" />
        <ConeField register={register} messages={messages} name={`${at}.clay.maxCone`} label="Clay rated to cone" />
        <Field label="State" hint="Greenware has not been fired yet." error={messages[`${at}.state`]}>
          {(a11y) => (
            <Select {...a11y} {...register(`${at}.state`)}>
              <option value="greenware">Greenware</option>
              <option value="bisque">Bisque</option>
            </Select>
          )}
        </Field>
        {piece.state === 'greenware' && (
          <div className="flex items-end pb-2 sm:col-span-2">
            <Checkbox label="Bone dry (no longer cool against the cheek)" {...register(`${at}.boneDry`)} />
          </div>
        )}
      </div>

      <div className="mt-3 space-y-3">
        <Checkbox label="Glazed" {...register(`${at}.glazed`)} />
        {piece.glazed && (
          <div className="grid gap-3 border-l-2 border-clay-100 pl-3 sm:grid-cols-2">
            <ConeField register={register} messages={messages} name={`${at}.glaze.minCone`} label="Glaze from cone" />
            <ConeField register={register} messages={messages} name={`${at}.glaze.maxCone`} label="Glaze to cone" />
            <div className="space-y-2 sm:col-span-2">
              <Checkbox label="Runny glaze" {...register(`${at}.glaze.runny`)} />
              <Checkbox label="Glaze on the foot" {...register(`${at}.glaze.onFoot`)} />
              <Checkbox label="Set on a cookie or stilt" {...register(`${at}.glaze.onCookie`)} />
            </div>
          </div>
        )}
      </div>

      <div className="mt-4 flex justify-end">
        <Button variant="ghost" size="sm" onClick={onRemove} aria-label={`Remove ${title}`}>
          Remove
        </Button>
      </div>
    </fieldset>
  )
}
