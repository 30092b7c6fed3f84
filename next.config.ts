import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  poweredByHeader: false,
  typedRoutes: false,
  images: { unoptimized: true },
  // pdfkit loads its built-in fonts with a `require` made from its own URL at run time: leave it to Node.
  serverExternalPackages: ["pdfkit"],
  // `npm test` type-checks the whole project (tests included) before it builds; no need twice.
  typescript: { ignoreBuildErrors: true },
  // The truck owner's status page: its link is a secret, so it must not leak through Referer or
  // land in a search index.
  async headers() {
    return [
      {
        source: "/status/:path*",
        headers: [
          { key: "Referrer-Policy", value: "no-referrer" },
          { key: "X-Robots-Tag", value: "noindex, nofollow" },
        ],
      },
    ];
  },
};

export default nextConfig;
