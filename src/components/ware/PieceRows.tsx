import { useFieldArray, useWatch, type Control, type UseFormRegister } from 'react-hook-form'
import { newPiece, type PieceFormValues } from '../../lib/pieceDraft'
import type { FieldMessages } from '../../lib/schemaMessages'
import { COUNT, lengthMeasure, pieceWeightMeasure, type UnitSystem } from '../../lib/units'
import { Button } from '../ui/Button'
import { Checkbox, Field, Select, TextInput } from '../ui/Field'
import { FormSection } from '../ui/FormSection'
import { MeasureField } from '../ui/MeasureField'
import { pieceRowId } from './CheckResults'
import { ConeField } from './ConeField'

interface PieceRowsProps<T extends PieceFormValues> {
  control: Control<T>
  register: UseFormRegister<T>
  /** The schema's messages by field name ("pieces.0.heightMm"), already in the units on screen. */
  messages: FieldMessages
  units: UnitSystem
  title?: string
  lead?: string
}

interface RowProps {
  control: Control<PieceFormValues>
  register: UseFormRegister<PieceFormValues>
  messages: FieldMessages
  units: UnitSystem
  index: number
  onRemove: (() => void) | null
}

/**
 * The pieces of a form, one row per kind of piece, each with its size, wall, clay, state and glaze.
 * Pages put ConeSuggestions once beside it.
 */
export function PieceRows<T extends PieceFormValues>(props: PieceRowsProps<T>) {
  // The rows touch only `pieces`; seen through that part of the form, their field paths type-check.
  const control = props.control as unknown as Control<PieceFormValues>
  const register = props.register as unknown as UseFormRegister<PieceFormValues>
  const { messages, units } = props
  const { fields, append, remove } = useFieldArray({ control, name: 'pieces' })
  return (
    <FormSection
      title={props.title ?? 'Pieces'}
      lead={props.lead ?? 'One row per kind of piece; sizes are the outside of the piece as it will sit on the shelf.'}
    >
      <div className="space-y-4">
        {fields.map((field, index) => (
          <PieceRow
            key={field.id}
            index={index}
            control={control}
            register={register}
            messages={messages}
            units={units}
            onRemove={fields.length > 1 ? () => remove(index) : null}
          />
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

function PieceRow({ control, register, messages, units, index, onRemove }: RowProps) {
  const piece = useWatch({ control, name: `pieces.${index}` })
  const length = lengthMeasure(units)
  const at = `pieces.${index}` as const
  const title = `Piece ${index + 1}`
  const measured = { control, units }

  return (
    <fieldset id={pieceRowId(index)} className="scroll-mt-4 rounded-control border border-slip-200 p-4">
      <legend className="px-1 text-sm font-semibold text-slip-800">{title}</legend>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
        <Field label="Label" hint="Optional: how findings name it." error={messages[`${at}.label`]} className="sm:col-span-2 lg:col-span-2">
          {(a11y) => <TextInput {...a11y} placeholder={title} {...register(`${at}.label`)} />}
        </Field>
        <MeasureField {...measured} name={`${at}.quantity`} label="How many" measure={COUNT} error={messages[`${at}.quantity`]} />
        <MeasureField {...measured} name={`${at}.heightMm`} label="Height" measure={length} error={messages[`${at}.heightMm`]} />
        <MeasureField
          {...measured}
          name={`${at}.widthMm`}
          label={piece.round ? 'Diameter' : 'Width'}
          measure={length}
          error={messages[`${at}.widthMm`]}
        />
        {!piece.round && (
          <MeasureField {...measured} name={`${at}.depthMm`} label="Depth" measure={length} error={messages[`${at}.depthMm`]} />
        )}
        <MeasureField
          {...measured}
          name={`${at}.wallThicknessMm`}
          label={piece.form === 'solid' ? 'Thickness at its thickest' : 'Wall thickness'}
          measure={length}
          error={messages[`${at}.wallThicknessMm`]}
        />
        <div className="flex items-end pb-2">
          <Checkbox label="Round" {...register(`${at}.round`)} />
        </div>
        <Field
          label="Form"
          hint="Closed: hollow and sealed, like a bead or a hollow sculpture. Solid: no inside at all."
          error={messages[`${at}.form`]}
        >
          {(a11y) => (
            <Select {...a11y} {...register(`${at}.form`)}>
              <option value="open">Open (a pot, a dish)</option>
              <option value="closed">Closed</option>
              <option value="solid">Solid</option>
            </Select>
          )}
        </Field>
        {piece.form === 'closed' && (
          <div className="flex items-end pb-2">
            <Checkbox label="Has a vent hole" {...register(`${at}.ventHole`)} />
          </div>
        )}
        <MeasureField
          {...measured}
          name={`${at}.weightG`}
          label="Weight of one"
          hint="Optional: lets the studio check what a shelf carries."
          measure={pieceWeightMeasure(units)}
          error={messages[`${at}.weightG`]}
        />
      </div>

      <div className="mt-3 grid gap-3 sm:grid-cols-3">
        <Field label="Clay body" error={messages[`${at}.clay.body`]}>
          {(a11y) => (
            <Select {...a11y} {...register(`${at}.clay.body`)}>
              <option value="earthenware">Earthenware</option>
              <option value="stoneware">Stoneware</option>
              <option value="porcelain">Porcelain</option>
              <option value="raku">Raku clay</option>
              <option value="other">Other</option>
            </Select>
          )}
        </Field>
        <ConeField register={register} error={messages[`${at}.clay.minCone`]} name={`${at}.clay.minCone`} label="Clay matures from cone" />
        <ConeField register={register} error={messages[`${at}.clay.maxCone`]} name={`${at}.clay.maxCone`} label="Clay rated to cone" />
        <Field
          label="State"
          hint="Greenware has not been fired yet; glaze fired is ready for lustre or decals."
          error={messages[`${at}.state`]}
        >
          {(a11y) => (
            <Select {...a11y} {...register(`${at}.state`)}>
              <option value="greenware">Greenware</option>
              <option value="bisque">Bisque</option>
              <option value="glazed">Glaze fired</option>
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
            <ConeField register={register} error={messages[`${at}.glaze.minCone`]} name={`${at}.glaze.minCone`} label="Glaze from cone" />
            <ConeField register={register} error={messages[`${at}.glaze.maxCone`]} name={`${at}.glaze.maxCone`} label="Glaze to cone" />
            <Field
              label="Stands on"
              hint="A cookie or catch tray catches drips; a stilt lifts a glazed foot at low fire only."
              error={messages[`${at}.glaze.support`]}
            >
              {(a11y) => (
                <Select {...a11y} {...register(`${at}.glaze.support`)}>
                  <option value="none">The shelf</option>
                  <option value="cookie">A cookie</option>
                  <option value="tray">A catch tray</option>
                  <option value="stilt">A stilt</option>
                </Select>
              )}
            </Field>
            <div className="space-y-2">
              <Checkbox label="Runny glaze" {...register(`${at}.glaze.runny`)} />
              <Checkbox label="Glaze on the foot" {...register(`${at}.glaze.onFoot`)} />
              <Checkbox label="Reduction glaze (copper red, celadon, shino)" {...register(`${at}.glaze.reductionOnly`)} />
              <Checkbox label="Not yet tried on a test tile at this cone" {...register(`${at}.glaze.untested`)} />
            </div>
            <fieldset className="sm:col-span-2">
              <legend className="text-sm font-medium text-slip-800">Colourants that travel or fume</legend>
              <div className="mt-1 flex flex-wrap gap-x-4 gap-y-2">
                <Checkbox label="Copper" value="copper" {...register(`${at}.glaze.colourants`)} />
                <Checkbox label="Chrome–tin pink" value="chrome-tin" {...register(`${at}.glaze.colourants`)} />
                <Checkbox label="Cobalt" value="cobalt" {...register(`${at}.glaze.colourants`)} />
                <Checkbox label="Manganese" value="manganese" {...register(`${at}.glaze.colourants`)} />
              </div>
            </fieldset>
          </div>
        )}
        <fieldset>
          <legend className="text-sm font-medium text-slip-800">Anything in it besides clay and glaze</legend>
          <div className="mt-1 flex flex-wrap gap-x-4 gap-y-2">
            <Checkbox label="Glass" value="glass" {...register(`${at}.materials`)} />
            <Checkbox label="Metal (wire, hooks)" value="metal" {...register(`${at}.materials`)} />
            <Checkbox label="Combustibles (sawdust, seeds, fibre)" value="combustible" {...register(`${at}.materials`)} />
            <Checkbox label="Saggar with salts" value="saggar-salts" {...register(`${at}.materials`)} />
            <Checkbox label="Paper clay" value="paper-clay" {...register(`${at}.materials`)} />
          </div>
        </fieldset>
      </div>

      {onRemove && (
        <div className="mt-4 flex justify-end">
          <Button variant="ghost" size="sm" onClick={onRemove} aria-label={`Remove ${title}`}>
            Remove
          </Button>
        </div>
      )}
    </fieldset>
  )
}
