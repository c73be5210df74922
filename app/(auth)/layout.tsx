import { BrandMark } from "@/components/ui/brand-mark";

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <main className="flex min-h-screen items-center justify-center p-6">
      <div className="w-full max-w-md">
        <div className="mb-8 flex items-center gap-3 text-accent">
          <BrandMark size={40} />
          <div>
            <p className="text-2xl font-semibold tracking-tight text-text">Benchwarden</p>
            <p className="text-sm text-muted">Laser benches, predicted and signed off</p>
          </div>
        </div>
        <div className="rounded-xl border border-line bg-panel p-6 shadow-lg">{children}</div>
      </div>
    </main>
  );
}
