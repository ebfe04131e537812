/** A state in words with a symbol; abnormal states are bold and red-bordered as well. */
export function StateWord({ symbol, word, bad }: { symbol: string; word: string; bad: boolean }) {
  return (
    <span className={`inline-flex items-center gap-1 ${bad ? 'rounded-md border-2 border-alarm-700 bg-alarm-50 px-1 font-bold text-alarm-900' : ''}`}>
      <span aria-hidden="true">{symbol}</span>
      {word}
    </span>
  );
}
