import type { NetworkDocument } from '../network-document';
/** STUB — the demo network (an invented hill smallholding) is written by the engine work. */
export const hillSmallholding: NetworkDocument = { schema: 'runnel.network/1', headloss: 'hazen-williams', nodes: [], links: [] };
