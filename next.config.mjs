/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  // A second build folder lets two app instances (say, two people testing side by side) coexist.
  distDir: process.env.NEXT_DIST_DIR || ".next",
  poweredByHeader: false,
  // Node libraries that read files of their own at run time; keep them out of the server bundle.
  serverExternalPackages: ["pg", "nodemailer", "pdfkit"],
  experimental: {
    // The stylesheet (Tailwind's utilities, about 6 KB gzip) goes into each page's <head> as a
    // <style> instead of a <link>: the first paint no longer waits for a second request, which on a
    // slow mobile link is a round trip before anything shows. The pages' policy allows inline styles
    // (lib/http/content-security-policy.ts); client-side navigations still load the file.
    inlineCss: true,
  },
  async headers() {
    return [
      {
        source: "/sw.js",
        headers: [
          { key: "Cache-Control", value: "no-cache, no-store, must-revalidate" },
          { key: "Service-Worker-Allowed", value: "/" },
        ],
      },
      {
        source: "/:path*",
        headers: [
          { key: "X-Content-Type-Options", value: "nosniff" },
          { key: "Referrer-Policy", value: "same-origin" },
          { key: "X-Frame-Options", value: "DENY" },
          {
            key: "Permissions-Policy",
            value: "camera=(self), microphone=(), geolocation=(), payment=(), usb=(), interest-cohort=()",
          },
        ],
      },
      // Pages get a policy with a fresh script nonce from proxy.ts; route handlers and the worker
      // script, which proxy.ts leaves alone, get this one.
      ...["/api/:path*", "/sw.js"].map((source) => ({
        source,
        headers: [
          {
            key: "Content-Security-Policy",
            value: "frame-ancestors 'none'; base-uri 'self'; object-src 'none'; form-action 'self'",
          },
        ],
      })),
    ];
  },
};

export default nextConfig;
