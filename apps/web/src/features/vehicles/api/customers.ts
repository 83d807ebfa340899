import { customerListResponseSchema, customerSchema, type Customer, type CustomerInput, type CustomerListResponse } from '@tappet/contracts';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';
import { customersKey } from './keys';

const customersApi = (shopId: string) => `/shops/${encodeURIComponent(shopId)}/customers`;

/** GET /customers?q=: customers whose name, e-mail or phone contains the words. */
export function customersQueryOptions(shopId: string, q: string) {
  return queryOptions({
    queryKey: shopQueryKey(shopId, 'customers', 'list', q),
    queryFn: ({ signal }): Promise<CustomerListResponse> => api.get(`${customersApi(shopId)}?pageSize=20${q ? `&q=${encodeURIComponent(q)}` : ''}`, { schema: customerListResponseSchema, signal }),
    staleTime: 30_000,
  });
}

export function useCustomers(shopId: string, q: string) {
  return useQuery(customersQueryOptions(shopId, q));
}

/** POST /customers (the owner): a new customer, e.g. from the vehicle form. */
export function useCreateCustomer(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CustomerInput): Promise<Customer> => api.post(customersApi(shopId), input, { schema: customerSchema }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: customersKey(shopId) }),
  });
}
