import { useEffect, useRef, useState } from 'react';
import type { ClassTable } from '../core/classTable.ts';
import { filesCheck, type FileCheckRow } from './fileCheck.ts';

function Preview({ image }: { image: ImageData }) {
  const ref = useRef<HTMLCanvasElement>(null);
  useEffect(() => {
    const canvas = ref.current;
    if (!canvas) return;
    canvas.width = image.width;
    canvas.height = image.height;
    canvas.getContext('2d')!.putImageData(image, 0, 0);
  }, [image]);
  return <canvas ref={ref} className="fc-preview" />;
}

function Row({ row }: { row: FileCheckRow }) {
  return (
    <li className={row.error ? 'fc-row fc-bad' : 'fc-row'} data-file={row.file}>
      <div className="fc-head">
        <strong>{row.file}</strong>
        <span className="fc-dim">{(row.bytes / 1024).toFixed(1)} KiB</span>
      </div>
      {row.error ? (
        <p className="fc-error" role="alert">{row.error}</p>
      ) : (
        <div className="fc-body">
          {row.preview && <Preview image={row.preview} />}
          <div>
            <p>
              {row.width} × {row.height} px · {row.encoding}
            </p>
            <table className="fc-ids">
              <thead>
                <tr>
                  <th>id</th>
                  <th>class</th>
                  <th>pixels</th>
                </tr>
              </thead>
              <tbody>
                {row.ids!.map((c) => (
                  <tr key={c.id}>
                    <td>{c.id}</td>
                    <td>
                      <span className="swatch" style={{ background: c.color }} /> {c.name}
                    </td>
                    <td>{c.count.toLocaleString('en')}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </div>
      )}
    </li>
  );
}

/** Drop zone that decodes label PNGs exactly and lists what each holds, or why it cannot be read. */
export function FileCheck() {
  const [table, setTable] = useState<ClassTable | null>(null);
  const [tableError, setTableError] = useState<string | null>(null);
  const [rows, setRows] = useState<FileCheckRow[]>([]);
  const [busy, setBusy] = useState(false);
  const [over, setOver] = useState(false);

  async function take(list: FileList | null) {
    if (!list || list.length === 0) return;
    setBusy(true);
    const result = await filesCheck([...list], table);
    setTable(result.table);
    setTableError(result.tableError);
    setRows((prev) => [...result.rows, ...prev]);
    setBusy(false);
  }

  return (
    <section className="file-check">
      <label
        className={over ? 'fc-drop fc-over' : 'fc-drop'}
        onDragOver={(e) => {
          e.preventDefault();
          setOver(true);
        }}
        onDragLeave={() => setOver(false)}
        onDrop={(e) => {
          e.preventDefault();
          setOver(false);
          void take(e.dataTransfer.files);
        }}
      >
        <input type="file" multiple accept=".png,.json" onChange={(e) => void take(e.currentTarget.files)} />
        <span>Drop label PNGs here (add a classes.json to name the ids), or click to choose files</span>
      </label>
      <p className="fc-dim">
        {table ? `Class table: ${table.classes.length} classes, void id ${table.ignore}` : 'No class table: ids are shown by number.'}
        {busy && ' · decoding…'}
      </p>
      {tableError && <p className="fc-error" role="alert">{tableError}</p>}
      <ul className="fc-list">
        {rows.map((r, i) => (
          <Row key={`${r.file}-${rows.length - i}`} row={r} />
        ))}
      </ul>
    </section>
  );
}
