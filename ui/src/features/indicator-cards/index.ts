/** What other areas may use from the indicator cards (e.g. the live run page embeds the panel). */
export { CardSetsPanel } from './components/CardSetsPanel';
export { PvDiagram } from './components/PvDiagram';
export { cardSetsQuery, cardKeys } from './api/indicator-cards.api';
