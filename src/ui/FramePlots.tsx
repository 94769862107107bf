// Per-frame plots under the scoreboard: the chosen class's measure (or the frame mean IoU) over the
// frames, and a histogram of those frame scores, drawn with uPlot. A click on the line goes to that frame.
import { useEffect, useMemo, useRef, useState } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { CLASS_MEASURE_NAMES, histogramOf } from '../state/classFrames.ts';
import { frameTableColumn } from '../state/frameRows.ts';
import { classColumnSel, classInfoSel, frameTableSel, shownRunSel } from '../state/selectors.ts';
import { useCommand } from './commands/useCommand.tsx';
import { useApp } from './storeContext.tsx';

/** Histogram bins over 0..100 %. */
const BINS = 20;
const AXIS = { stroke: '#8a94a0', grid: { stroke: '#2c323a', width: 1 }, ticks: { stroke: '#2c323a', width: 1 } };
/** Whole-number steps for the count axis, so its ticks are real counts. */
const COUNT_INCRS = [1, 2, 5, 10, 20, 50, 100, 200, 500, 1000, 2000, 5000, 10000, 20000, 50000, 100000, 200000, 500000];

/** The chart data the plots draw: per-frame values (% or null) and the histogram's counts per bin. */
export interface FramePlotData {
  title: string;
  frames: (number | null)[];
  counts: number[];
}

/** Draws `data` with uPlot into a box of `width` px, keeping one chart per `make` and updating its data. */
function Chart({ width, height, make, data, testId, onPick }: {
  width: number; height: number; make: (w: number, h: number) => uPlot.Options; data: uPlot.AlignedData; testId: string; onPick?: (idx: number) => void;
}) {
  const box = useRef<HTMLDivElement>(null);
  const chart = useRef<uPlot | null>(null);
  const pick = useRef(onPick);
  pick.current = onPick;
  useEffect(() => {
    if (!box.current) return;
    const u = new uPlot(make(width, height), data, box.current);
    chart.current = u;
    // The drawn data, for tests and the browser's console.
    (box.current as HTMLDivElement & { hairlineChart?: uPlot }).hairlineChart = u;
    const over = u.over;
    const click = () => {
      const idx = u.cursor.idx;
      if (idx !== null && idx !== undefined) pick.current?.(idx);
    };
    over.addEventListener('click', click);
    return () => {
      over.removeEventListener('click', click);
      u.destroy();
      chart.current = null;
    };
    // The chart is made once per option set; data and size are updated below.
  }, [make]);
  useEffect(() => chart.current?.setData(data), [data]);
  useEffect(() => chart.current?.setSize({ width, height }), [width, height]);
  return <div ref={box} className="frame-plot" data-testid={testId} />;
}

const lineOptions = (title: string) => (w: number, h: number): uPlot.Options => ({
  width: w, height: h, title,
  legend: { show: false },
  cursor: { drag: { x: false, y: false } },
  scales: { x: { time: false }, y: { range: [0, 100] } },
  axes: [
    { ...AXIS, label: 'frame', size: 36, labelSize: 14 },
    { ...AXIS, label: '%', size: 40, labelSize: 14 },
  ],
  series: [{ label: 'frame' }, { label: title, stroke: '#f0b429', width: 1.5, points: { show: true, size: 4, fill: '#f0b429' }, spanGaps: false }],
});

const histOptions = (title: string) => (w: number, h: number): uPlot.Options => ({
  width: w, height: h, title,
  legend: { show: false },
  cursor: { drag: { x: false, y: false } },
  scales: { x: { time: false, range: [0, 100] }, y: { range: (_u, _min, max) => [0, Math.max(1, max)] } },
  axes: [
    { ...AXIS, label: 'frame score (%)', size: 36, labelSize: 14 },
    { ...AXIS, label: 'frames', size: 44, labelSize: 14, incrs: COUNT_INCRS, values: (_u, splits) => splits.map((v) => String(Math.round(v))) },
  ],
  series: [{}, { label: 'frames', fill: 'rgba(86,180,233,0.7)', stroke: '#56b4e9', paths: uPlot.paths.bars!({ size: [0.9, Infinity] }), points: { show: false } }],
});

/** The plots of run A: the class the frame list is sorted by (its measure), else each frame's mean IoU. */
export function FramePlots() {
  const command = useCommand();
  const run = useApp(shownRunSel);
  const byClass = useApp((s) => s.frameClass);
  const classColumn = useApp(classColumnSel);
  const table = useApp(frameTableSel);
  const classes = useApp(classInfoSel);
  const outer = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(300);
  useEffect(() => {
    const el = outer.current;
    if (!el) return;
    const ro = new ResizeObserver(() => setWidth(Math.max(160, Math.floor(el.clientWidth))));
    ro.observe(el);
    return () => ro.disconnect();
  }, []);
  const plot = useMemo((): FramePlotData => {
    const column = byClass && classColumn ? classColumn : frameTableColumn(table, 'meanIoU');
    const name = byClass ? `${classes.get(byClass.classId)?.name ?? byClass.classId} ${CLASS_MEASURE_NAMES[byClass.measure]}` : 'mean IoU';
    return {
      title: `${name}${run ? `, ${run}` : ''}`,
      frames: Array.from(column, (v) => (Number.isNaN(v) ? null : v * 100)),
      counts: histogramOf(column, BINS),
    };
  }, [byClass, classColumn, table, classes, run]);
  const lineMake = useMemo(() => lineOptions(`${plot.title} per frame`), [plot.title]);
  const histMake = useMemo(() => histOptions(`${plot.title}: frames per score`), [plot.title]);
  const lineData = useMemo((): uPlot.AlignedData => [plot.frames.map((_, i) => i + 1), plot.frames], [plot]);
  const histData = useMemo((): uPlot.AlignedData => [plot.counts.map((_, i) => ((i + 0.5) * 100) / BINS), plot.counts], [plot]);
  if (!run || table.count === 0) return null;
  return (
    <div className="frame-plots" ref={outer} data-measure={byClass ? `${byClass.classId}:${byClass.measure}` : 'meanIoU'}>
      <Chart width={width} height={150} make={lineMake} data={lineData} testId="plot-frames" onPick={(i) => command('frame.go', i)} />
      <Chart width={width} height={140} make={histMake} data={histData} testId="plot-histogram" />
      <p className="dim small">
        {byClass ? 'Click a class again for its next measure, or a score column of the frame list to go back.' : 'Click a class above to plot its IoU per frame.'} Click the line to go to a frame.
      </p>
    </div>
  );
}
