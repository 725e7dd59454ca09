import { ApiClientError } from "./api";

/**
 * A multipart POST with upload progress. fetch() reports no upload progress, so this
 * uses XMLHttpRequest; `abort()` cancels it (the server then keeps nothing).
 */
export function postFormWithProgress<T>(
  url: string,
  form: FormData,
  onProgress: (loadedBytes: number, totalBytes: number) => void,
): { promise: Promise<T>; abort: () => void } {
  const xhr = new XMLHttpRequest();
  const promise = new Promise<T>((resolve, reject) => {
    xhr.open("POST", url);
    xhr.withCredentials = true;
    xhr.responseType = "text";
    xhr.setRequestHeader("accept", "application/json");
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable) onProgress(event.loaded, event.total);
    };
    xhr.onload = () => {
      let body: unknown = null;
      try {
        body = xhr.responseText ? JSON.parse(xhr.responseText) : null;
      } catch {
        // not JSON: a proxy's error page, say
      }
      if (xhr.status >= 200 && xhr.status < 300) return resolve(body as T);
      const error = (body as { error?: { code?: string; message?: string; fields?: Record<string, string[]> } } | null)?.error;
      reject(
        new ApiClientError(
          xhr.status,
          error?.code ?? (xhr.status === 413 ? "payload_too_large" : "internal"),
          error?.message ?? (xhr.status === 413 ? "The file is larger than Tapernote accepts." : `The upload failed (${xhr.status}).`),
          error?.fields,
        ),
      );
    };
    xhr.onerror = () => reject(new ApiClientError(0, "network", "The upload was interrupted. Check your connection and try again."));
    xhr.onabort = () => reject(new ApiClientError(0, "aborted", "Upload cancelled."));
    xhr.send(form);
  });
  return { promise, abort: () => xhr.abort() };
}
