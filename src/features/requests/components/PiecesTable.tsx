import type { Piece } from '../../../../shared/firing/check'
import { Table, Td, Th } from '../../../components/ui/Table'
import { pieceName } from '../../../components/ware/CheckResults'
import { formatLength, type UnitSystem } from '../../../lib/units'
import { clayInWords, glazeInWords, pieceSizeInWords, pieceStateInWords } from '../requestWords'

/** The pieces of a request as the reader measures them. */
export function PiecesTable({ pieces, units }: { pieces: Piece[]; units: UnitSystem }) {
  return (
    <Table caption="Pieces">
      <thead>
        <tr>
          <Th>Piece</Th>
          <Th className="text-right">How many</Th>
          <Th>Size</Th>
          <Th>Wall</Th>
          <Th>Clay</Th>
          <Th>State</Th>
          <Th>Glaze</Th>
        </tr>
      </thead>
      <tbody className="divide-y divide-slip-100">
        {pieces.map((piece, index) => (
          <tr key={index} data-testid="request-piece">
            <Td className="font-medium">{pieceName(pieces, index)}</Td>
            <Td className="text-right tabular-nums">{piece.quantity}</Td>
            <Td className="whitespace-nowrap">{pieceSizeInWords(piece, units)}</Td>
            <Td className="whitespace-nowrap">{formatLength(piece.wallThicknessMm, units)}</Td>
            <Td>{clayInWords(piece)}</Td>
            <Td>{pieceStateInWords(piece)}</Td>
            <Td>{glazeInWords(piece)}</Td>
          </tr>
        ))}
      </tbody>
    </Table>
  )
}
