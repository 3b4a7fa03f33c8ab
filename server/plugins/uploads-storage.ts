// Chooses where uploaded files live, at run time. Without settings the `uploads` mount of
// nuxt.config.ts (a folder, .data/uploads) stays. NUXT_UPLOADS_S3_BUCKET (with endpoint,
// region and keys) mounts an S3-compatible bucket instead; NUXT_UPLOADS_DIR moves the folder.
// Files are sealed under NUXT_FILES_KEY: a malformed key (or old key) stops the start here; a
// missing one stops a production start (00.production-start.ts) and elsewhere only uploads.
import { FileKeyError } from '#domain/files/file-crypt'
import { uploadsDriverFromEnv } from '#domain/files/file-store'
import { serverFileKeyring } from '#domain/files/storage'

function keyring() {
  try {
    return serverFileKeyring()
  }
  catch (error) {
    if (!(error instanceof FileKeyError)) throw error
    console.error(`\n✖ Gridmark will not start: ${error.message}\n`)
    process.exit(1)
  }
}

export default defineNitroPlugin(() => {
  const chosen = uploadsDriverFromEnv(process.env)
  if (chosen) {
    const storage = useStorage()
    void storage.unmount('uploads', false)
    storage.mount('uploads', chosen.driver)
    if (!chosen.folder) console.log(`[gridmark] uploads are stored in ${chosen.where}`)
  }
  if (!keyring().current) {
    console.warn('[gridmark] NUXT_FILES_KEY is not set: uploads are refused until it is (npm start generates one).')
  }
})
