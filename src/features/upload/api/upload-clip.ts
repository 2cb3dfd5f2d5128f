import type { ClipResponse } from '@shared/schemas/clip.schema';
import type { View } from '@shared/keypoints';
import { api, type UploadOptions } from '@/lib/api-client';

export interface UploadClipRequest {
  file: File;
  sessionId: string;
  athleteIds: string[];
  view: View;
}

export function uploadClip(request: UploadClipRequest, options: UploadOptions = {}): Promise<ClipResponse> {
  const form = new FormData();
  // Text fields first, so the server can refuse bad fields before it reads the whole file.
  form.set('sessionId', request.sessionId);
  form.set('athleteIds', request.athleteIds.join(','));
  form.set('view', request.view);
  form.set('file', request.file, request.file.name);
  return api.upload<ClipResponse>('/api/clips', form, options);
}
