import { useMutation } from '@tanstack/react-query';
import type { SimulateRequest } from '@shared/schemas/harness';
import { api } from '@/lib/api-client';

/** The SPICE netlist of a design at one knob setting, written by the server (plain text). */
export const getSpiceNetlist = (body: SimulateRequest) => api.post<string>('/api/harness/netlist', body, { as: 'text' });

/** A mutation, not a query: it runs when the user asks for the file, and nothing is cached. */
export const useSpiceNetlist = () => useMutation({ mutationFn: getSpiceNetlist });
