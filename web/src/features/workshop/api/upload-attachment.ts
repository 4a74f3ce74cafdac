import { useMutation, useQueryClient } from '@tanstack/react-query';
import { uploadFile } from '@/lib/api-client';
import { workshopKeys } from './types';

export function useUploadAttachment(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ file, kind }: { file: File; kind: 'photo' | 'printout' }) => uploadFile<{ id: number }>(`/api/inspections/${id}/attachments`, file, { kind }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: workshopKeys.inspection(id) }),
  });
}
