// Tailwind CSS 4 reads its theme from app/globals.css (@theme); this file is loaded there with
// @config and holds only what CSS cannot say: where class names are found.
import type { Config } from "tailwindcss";

export default {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
} satisfies Config;
