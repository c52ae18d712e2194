import "server-only";
import { UTApi } from "uploadthing/server";
import { uploadthingConfig } from "@/app/_server/uploadthing-config";

let api: UTApi | undefined;

function utapi(): UTApi {
  api ??= new UTApi(uploadthingConfig());
  return api;
}

/** Best effort: a file we refuse or no longer need is removed from upload storage. */
export async function deleteStoredFile(fileKey: string): Promise<void> {
  try {
    await utapi().deleteFiles(fileKey);
  } catch (error) {
    console.error(`[storage] could not delete ${fileKey}: ${error instanceof Error ? error.message : String(error)}`);
  }
}
