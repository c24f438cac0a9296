/** PUTs a blob with XMLHttpRequest, the one browser API that reports upload progress. */
export function putWithProgress(
  url: string,
  body: Blob,
  contentType: string | null,
  onProgress: (sentBytes: number) => void,
): Promise<{ etag: string | null }> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("PUT", url);
    if (contentType) xhr.setRequestHeader("content-type", contentType);
    xhr.upload.onprogress = (e) => onProgress(e.loaded);
    xhr.onload = () => {
      if (xhr.status >= 200 && xhr.status < 300) resolve({ etag: xhr.getResponseHeader("etag") });
      else reject(new Error(`Storage refused the file (HTTP ${xhr.status})`));
    };
    xhr.onerror = () => reject(new Error("The connection to storage dropped; check the signal and try again"));
    xhr.send(body);
  });
}

export async function apiJson<T>(path: string, init?: { method?: string; body?: unknown }): Promise<T> {
  const res = await fetch(path, {
    method: init?.method ?? "GET",
    headers: init?.body !== undefined ? { "content-type": "application/json" } : undefined,
    body: init?.body !== undefined ? JSON.stringify(init.body) : undefined,
  });
  const data = await res.json().catch(() => ({}));
  if (!res.ok) throw new Error((data as { error?: { message?: string } }).error?.message ?? `Request failed (HTTP ${res.status})`);
  return data as T;
}
