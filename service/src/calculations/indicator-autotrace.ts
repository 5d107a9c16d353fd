/**
 * A card photograph's pixels → the proposed trace (shared-types' proposeCardTrace) → its area and
 * mean effective pressure through the one calibration of traced cards (calibrateTrace).
 */
import { proposeCardTrace, type AutotraceImage, type AutotraceProposal, type CardTrace } from '@crankjournal/shared-types';
import { calibrateTrace } from './indicator-card.js';

export interface CardAutotraceResult {
  proposal: AutotraceProposal;
  /** The proposal as a card trace (null when the card was refused). */
  trace: CardTrace | null;
  areaSqIn: number | null;
  meanEffectivePressurePsi: number | null;
}

/**
 * Proposes a trace for the image and, when one is found, works out its area (in²) and MEP (psi). The scale
 * comes from the card length (the diagram's ends found in the photo) unless the image's pixels per inch is known.
 */
export function autotraceCard(
  image: AutotraceImage,
  scale: { lengthIn: number; springPsiPerIn: number; pixelsPerInch?: number },
): CardAutotraceResult {
  const proposal = proposeCardTrace(image);
  if (!proposal.found || !proposal.atmosphericLine || !proposal.admissionEndPx || !proposal.releaseEndPx) {
    return { proposal, trace: null, areaSqIn: null, meanEffectivePressurePsi: null };
  }
  const trace: CardTrace = {
    atmosphericLine: proposal.atmosphericLine,
    admissionEndPx: proposal.admissionEndPx,
    releaseEndPx: proposal.releaseEndPx,
    pointsPx: proposal.pointsPx,
  };
  const calibrated = calibrateTrace({
    atmosphericLine: trace.atmosphericLine,
    diagramStartPx: trace.admissionEndPx,
    diagramEndPx: trace.releaseEndPx,
    tracePx: trace.pointsPx,
    springPsiPerIn: scale.springPsiPerIn,
    cardLengthIn: scale.lengthIn,
    pixelsPerInch: scale.pixelsPerInch,
  });
  return { proposal, trace, areaSqIn: calibrated.areaSqIn, meanEffectivePressurePsi: calibrated.meanEffectivePressurePsi };
}
