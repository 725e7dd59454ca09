/** @type {import('next').NextConfig} */
const securityHeaders = [
  { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Permissions-Policy", value: "camera=(), geolocation=(), microphone=(self)" },
  { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
];

const nextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  // The engine's wasm packages and the mail libraries run on the Node.js server as they are.
  serverExternalPackages: [
    "@libsql/client",
    "libsql",
    "smtp-server",
    "mailparser",
    "nodemailer",
    "@wasm-audio-decoders/flac",
    "@echogarden/speex-resampler-wasm",
    // UMD/CommonJS packages the engine and the export writers import as default exports
    "wavefile",
    "@tonejs/midi",
    "midi-file",
    "fft.js",
    "meyda",
    "xmlbuilder2",
    "fast-xml-parser",
  ],
  async headers() {
    return [
      { source: "/:path*", headers: securityHeaders },
      // API answers are never framed or sniffed either, and carry a restrictive CSP of their own.
      { source: "/api/:path*", headers: [{ key: "Content-Security-Policy", value: "default-src 'none'; frame-ancestors 'none'" }] },
    ];
  },
};

export default nextConfig;
