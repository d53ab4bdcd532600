'use client';

import { useId, useState } from 'react';
import { transformerLoad, voltageAtLoad } from '@/lib/electrical';

const AWG_CHOICES = [14, 16, 18, 20, 22];

function num(text: string): number {
  return text.trim() === '' ? NaN : Number(text.replace(',', '.'));
}

function NumberField({ label, value, onChange, suffix }: { label: string; value: string; onChange: (v: string) => void; suffix: string }) {
  const id = useId();
  return (
    <div>
      <label htmlFor={id} className="label text-base">
        {label}
      </label>
      <div className="flex items-center gap-2">
        <input id={id} className="input font-mono" inputMode="decimal" value={value} onChange={(e) => onChange(e.target.value)} />
        <span className="font-mono text-base text-muted">{suffix}</span>
      </div>
    </div>
  );
}

/** "What would 60 ft of 18 AWG at 0.5 A drop?" — the control wiring's share of a low valve voltage. */
export function VoltageDropAid() {
  const id = useId();
  const [awg, setAwg] = useState('18');
  const [length, setLength] = useState('60');
  const [amps, setAmps] = useState('0.5');
  const [source, setSource] = useState('24');
  let result: string;
  try {
    const r = voltageAtLoad({ awg: Number(awg), oneWayLengthFt: num(length), currentA: num(amps), sourceVolts: num(source) });
    result = `${length} ft of ${awg} AWG at ${amps} A drops ${r.dropVolts.toFixed(2)} V (${r.percentDrop.toFixed(1)} %), leaving ${r.loadVolts.toFixed(1)} V at the valve.`;
  } catch (e) {
    result = e instanceof Error ? e.message : String(e);
  }
  return (
    <section aria-labelledby={`${id}-h`} className="space-y-3">
      <h3 id={`${id}-h`} className="font-semibold">
        Voltage drop in the control wiring
      </h3>
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
        <div>
          <label htmlFor={`${id}-awg`} className="label text-base">
            Wire gauge
          </label>
          <select id={`${id}-awg`} className="input font-mono" value={awg} onChange={(e) => setAwg(e.target.value)}>
            {AWG_CHOICES.map((a) => (
              <option key={a} value={a}>
                {a} AWG
              </option>
            ))}
          </select>
        </div>
        <NumberField label="One-way length" value={length} onChange={setLength} suffix="ft" />
        <NumberField label="Load current" value={amps} onChange={setAmps} suffix="A" />
        <NumberField label="Source" value={source} onChange={setSource} suffix="V" />
      </div>
      <p aria-live="polite" className="rounded-lg bg-sunken px-3 py-2 font-mono text-base" data-testid="voltage-drop-result">
        {result}
      </p>
    </section>
  );
}

/** The transformer's load against its VA rating and the 3 A control fuse. */
export function TransformerLoadAid({ transformerVa }: { transformerVa: number | null }) {
  const id = useId();
  const [rating, setRating] = useState(transformerVa ? String(transformerVa) : '40');
  const [valveA, setValveA] = useState('0.5');
  const [otherA, setOtherA] = useState('0.3');
  const [fuse, setFuse] = useState('3');
  let result: string;
  try {
    const r = transformerLoad({
      ratingVa: num(rating),
      loadsA: [
        { name: 'gas valve', amps: num(valveA) },
        { name: 'control, relays and thermostat', amps: num(otherA) },
      ],
      fuseAmps: num(fuse),
    });
    result =
      `${r.totalVa.toFixed(1)} VA of ${rating} VA (${r.percentOfRating.toFixed(0)} %), ${r.currentA.toFixed(2)} A: ` +
      `${r.overloaded ? 'OVERLOADED' : 'within the rating'}; the ${fuse} A fuse ${r.fuseHolds ? 'holds' : 'would blow'}.`;
  } catch (e) {
    result = e instanceof Error ? e.message : String(e);
  }
  return (
    <section aria-labelledby={`${id}-h`} className="space-y-3">
      <h3 id={`${id}-h`} className="font-semibold">
        Transformer load
      </h3>
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
        <NumberField label="Rating" value={rating} onChange={setRating} suffix="VA" />
        <NumberField label="Gas valve" value={valveA} onChange={setValveA} suffix="A" />
        <NumberField label="Other loads" value={otherA} onChange={setOtherA} suffix="A" />
        <NumberField label="Fuse" value={fuse} onChange={setFuse} suffix="A" />
      </div>
      <p aria-live="polite" className="rounded-lg bg-sunken px-3 py-2 font-mono text-base" data-testid="transformer-load-result">
        {result}
      </p>
    </section>
  );
}

export function ElectricalAids({
  aids,
  transformerVa,
}: {
  aids: readonly ('voltage-drop' | 'transformer-load')[];
  transformerVa: number | null;
}) {
  if (aids.length === 0) return null;
  return (
    <details className="rounded-lg border border-line bg-raised">
      <summary className="flex min-h-touch cursor-pointer items-center px-4 font-semibold">Calculator</summary>
      <div className="space-y-6 px-4 pb-4">
        {aids.includes('voltage-drop') && <VoltageDropAid />}
        {aids.includes('transformer-load') && <TransformerLoadAid transformerVa={transformerVa} />}
      </div>
    </details>
  );
}
