// Photo hooks shared by every feature that shows photos of a record (one upload pipeline).
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api, qs } from "@/lib/api-client";
import type { PhotoDto, PhotoView } from "@shared/schemas/photos";

/** Photos of one owner record. */
export function usePhotos(productionId: string, ownerType: string, ownerId: string) {
  return useQuery({
    queryKey: ["photos", productionId, ownerType, ownerId],
    queryFn: () => api.get<PhotoDto[]>(`/productions/${productionId}/photos${qs({ ownerType, ownerId })}`),
    enabled: Boolean(ownerId),
  });
}

/** Uploads one photo for an owner. */
export function useUploadPhoto(productionId: string, ownerType: string, ownerId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (p: { file: File; view: PhotoView; caption?: string }) => {
      const form = new FormData();
      form.set("ownerType", ownerType);
      form.set("ownerId", ownerId);
      form.set("view", p.view);
      if (p.caption) form.set("caption", p.caption);
      form.set("file", p.file);
      return api.upload<PhotoDto>(`/productions/${productionId}/photos`, form);
    },
    onSuccess: () => qc.invalidateQueries({ queryKey: ["photos", productionId, ownerType, ownerId] }),
  });
}

/** Deletes a photo. */
export function useDeletePhoto(productionId: string, ownerType: string, ownerId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.delete(`/productions/${productionId}/photos/${id}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["photos", productionId, ownerType, ownerId] }),
  });
}
