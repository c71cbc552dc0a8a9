/** The one JSON shape of every failed API call. */
export interface ApiErrorBody {
  error: { code: string; message: string; fields?: Record<string, string> };
}
