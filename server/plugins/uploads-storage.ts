// Chooses where uploaded files live, at run time. Without settings the `uploads` mount of
// nuxt.config.ts (a folder, .data/uploads) stays. NUXT_UPLOADS_S3_BUCKET (with endpoint,
// region and keys) mounts an S3-compatible bucket instead; NUXT_UPLOADS_DIR moves the folder.
import fsDriver from 'unstorage/drivers/fs'
import s3Driver from 'unstorage/drivers/s3'

export default defineNitroPlugin(() => {
  const env = process.env
  const storage = useStorage()
  if (env.NUXT_UPLOADS_S3_BUCKET) {
    const missing = ['NUXT_UPLOADS_S3_ENDPOINT', 'NUXT_UPLOADS_S3_ACCESS_KEY_ID', 'NUXT_UPLOADS_S3_SECRET_ACCESS_KEY']
      .filter(name => !env[name])
    if (missing.length) throw new Error(`NUXT_UPLOADS_S3_BUCKET is set but ${missing.join(', ')} ${missing.length === 1 ? 'is' : 'are'} not.`)
    void storage.unmount('uploads', false)
    storage.mount('uploads', s3Driver({
      bucket: env.NUXT_UPLOADS_S3_BUCKET,
      endpoint: env.NUXT_UPLOADS_S3_ENDPOINT!,
      region: env.NUXT_UPLOADS_S3_REGION || 'auto',
      accessKeyId: env.NUXT_UPLOADS_S3_ACCESS_KEY_ID!,
      secretAccessKey: env.NUXT_UPLOADS_S3_SECRET_ACCESS_KEY!,
    }))
    console.log(`[gridmark] uploads are stored in the bucket ${env.NUXT_UPLOADS_S3_BUCKET}`)
  }
  else if (env.NUXT_UPLOADS_DIR) {
    void storage.unmount('uploads', false)
    storage.mount('uploads', fsDriver({ base: env.NUXT_UPLOADS_DIR }))
  }
})
