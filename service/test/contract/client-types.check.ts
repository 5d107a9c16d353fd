/**
 * A client generated from the API description (openapi-client.generated.ts, by openapi-typescript) agrees
 * with shared-types for what a logger integrator sends and gets back: the logger push and the round of
 * readings. Checked by `npm run typecheck`; test/contract.e2e-spec.ts fails when the generated file is
 * older than the description. Regenerate: see DEVELOPERS.md, "API description".
 */
import type { IngestResult, LoggerBatchRequest, RoundRequest } from '@crankjournal/shared-types';
import type { paths } from './openapi-client.generated.js';

type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const same = <A, B>(ok: Same<A, B>) => ok;

type PushBody = paths['/api/logger/readings']['post']['requestBody']['content']['application/json'];
type PushAnswer = paths['/api/logger/readings']['post']['responses']['201']['content']['application/json'];
type RoundBody = paths['/api/runs/{id}/rounds']['post']['requestBody']['content']['application/json'];
type RoundAnswer = paths['/api/runs/{id}/rounds']['post']['responses']['201']['content']['application/json'];

export const clientAgreesWithSharedTypes = [
  same<PushBody, LoggerBatchRequest>(true),
  same<PushAnswer, IngestResult>(true),
  same<RoundBody, RoundRequest>(true),
  same<RoundAnswer, IngestResult>(true),
];
