import {
  fileUploadResponseSchema,
  odometerReadingSchema,
  vehicleDetailSchema,
  type NumbersCheckInput,
  type OdometerInput,
  type OdometerReading,
  type StatusMoveInput,
  type VehicleDetail,
  type VehicleFile,
  type VehicleInput,
  type VehicleUpdate,
} from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { vehiclesApi, vehiclesKey } from './keys';

const one = (shopId: string, vehicleId: string) => `${vehiclesApi(shopId)}/${encodeURIComponent(vehicleId)}`;

/** Refreshes every vehicle query of the shop after a change. */
function useRefresh(shopId: string) {
  const queryClient = useQueryClient();
  return () => queryClient.invalidateQueries({ queryKey: vehiclesKey(shopId) });
}

/** POST /vehicles: records a vehicle arriving. */
export function useCreateVehicle(shopId: string) {
  const refresh = useRefresh(shopId);
  return useMutation({
    mutationFn: (input: VehicleInput): Promise<VehicleDetail> => api.post(vehiclesApi(shopId), input, { schema: vehicleDetailSchema }),
    onSuccess: refresh,
  });
}

/** PATCH /vehicles/:id: changes the record. */
export function useUpdateVehicle(shopId: string, vehicleId: string) {
  const refresh = useRefresh(shopId);
  return useMutation({
    mutationFn: (patch: VehicleUpdate): Promise<VehicleDetail> => api.patch(one(shopId, vehicleId), patch, { schema: vehicleDetailSchema }),
    onSuccess: refresh,
  });
}

/** POST …/status: moves the vehicle on. */
export function useMoveVehicle(shopId: string, vehicleId: string) {
  const refresh = useRefresh(shopId);
  return useMutation({
    mutationFn: (move: StatusMoveInput): Promise<VehicleDetail> => api.post(`${one(shopId, vehicleId)}/status`, move, { schema: vehicleDetailSchema }),
    onSuccess: refresh,
  });
}

/** POST …/odometer-readings. */
export function useAddOdometerReading(shopId: string, vehicleId: string) {
  const refresh = useRefresh(shopId);
  return useMutation({
    mutationFn: (input: OdometerInput): Promise<OdometerReading> => api.post(`${one(shopId, vehicleId)}/odometer-readings`, input, { schema: odometerReadingSchema }),
    onSuccess: refresh,
  });
}

/** POST …/numbers-check. */
export function useRecordNumbersCheck(shopId: string, vehicleId: string) {
  const refresh = useRefresh(shopId);
  return useMutation({
    mutationFn: (input: NumbersCheckInput): Promise<VehicleDetail> => api.post(`${one(shopId, vehicleId)}/numbers-check`, input, { schema: vehicleDetailSchema }),
    onSuccess: refresh,
  });
}

/** POST …/files (multipart): photos and PDFs, checked by the API one by one; all or nothing. */
export function useUploadVehicleFiles(shopId: string, vehicleId: string) {
  const refresh = useRefresh(shopId);
  return useMutation({
    mutationFn: async ({ files, caption }: { files: File[]; caption?: string }): Promise<VehicleFile[]> => {
      const form = new FormData();
      if (caption) form.append('caption', caption);
      for (const file of files) form.append('files', file, file.name);
      const res = await api.post(`${one(shopId, vehicleId)}/files`, form, { schema: fileUploadResponseSchema });
      return res.files;
    },
    onSuccess: refresh,
  });
}

/** DELETE …/files/:fileId. */
export function useDeleteVehicleFile(shopId: string, vehicleId: string) {
  const refresh = useRefresh(shopId);
  return useMutation({
    mutationFn: (fileId: string): Promise<void> => api.delete(`${one(shopId, vehicleId)}/files/${encodeURIComponent(fileId)}`),
    onSuccess: refresh,
  });
}
