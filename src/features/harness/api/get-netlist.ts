import { useMutation } from '@tanstack/react-query';
import type { SimulateRequest } from '@shared/schemas/harness';
import { sendJson } from './raw-request';

/** The SPICE netlist of a design at one knob setting, written by the server (plain text). */
export const getSpiceNetlist = (body: SimulateRequest) => sendJson('POST', '/api/harness/netlist', body, 'text/plain, application/json');

/** A mutation, not a query: it runs when the user asks for the file, and nothing is cached. */
export const useSpiceNetlist = () => useMutation({ mutationFn: getSpiceNetlist });
