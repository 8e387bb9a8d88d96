import { editionStateLabels, type EditionState } from '../../../../shared/contracts/editions';
import type { Tone } from '../../../components/alert';
import { StatusBadge } from '../../../components/status-badge';

const tones: Record<EditionState, Tone> = { draft: 'neutral', in_proof: 'info', approved: 'success', published: 'success' };

/** The state of an edition as a text badge. */
export function EditionStateBadge({ state }: { state: EditionState }) {
  return <StatusBadge tone={tones[state]}>{editionStateLabels[state]}</StatusBadge>;
}
