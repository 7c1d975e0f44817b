import type { Config } from "tailwindcss";

// A calm, dense palette of our own: slate text on near-white, one teal accent, amber for cautions.
export default {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        accent: { DEFAULT: "#0f766e", strong: "#115e59", soft: "#ccfbf1" },
        caution: { DEFAULT: "#92400e", soft: "#fef3c7" },
      },
    },
  },
} satisfies Config;
