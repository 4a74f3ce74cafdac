import { Caution } from '@/components/ui/caution';

export function ExposureCaution({ text, method }: { text: string; method: string }) {
  return (
    <Caution title="Screening estimate">
      {text} <span className="text-slate">Method: {method}</span>
    </Caution>
  );
}
