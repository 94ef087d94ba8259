import S3rver from "s3rver";

/**
 * A local S3-compatible store on loopback, with the upload bucket and a CORS rule that lets
 * the app's pages PUT to presigned URLs.
 */
export function startUploadFake(options: { port: number; directory: string; bucket: string; appOrigin: string }) {
  const cors = `<CORSConfiguration>
  <CORSRule>
    <AllowedOrigin>${options.appOrigin}</AllowedOrigin>
    <AllowedMethod>PUT</AllowedMethod>
    <AllowedMethod>GET</AllowedMethod>
    <AllowedMethod>HEAD</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>3000</MaxAgeSeconds>
  </CORSRule>
</CORSConfiguration>`;
  const server = new S3rver({
    address: "127.0.0.1",
    port: options.port,
    silent: true,
    directory: options.directory,
    configureBuckets: [{ name: options.bucket, configs: [cors] }],
  });
  return server.run().then(() => ({ close: () => server.close() }));
}
