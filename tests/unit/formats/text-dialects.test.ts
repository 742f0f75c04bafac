/**
 * Valid files come in many spellings. These are the variations the text
 * readers must take in their stride: column order, extra columns, line
 * endings, separators, key case, quoting, and number forms.
 */
import { describe, expect, it } from 'vitest';
import { bytes, chunked, extxyzText, makeSystem, readAll } from './synthetic.ts';
import { inspectTrajectory } from '../../../server/formats/inspect.ts';
import { openTrajectory } from '../../../server/formats/open-trajectory.ts';

const system = makeSystem(4, 3, 5);

async function positionsOf(text: string, name: string): Promise<number[][]> {
  return (await readAll(bytes(text), name)).map((f) => Array.from(f.positions));
}

describe('extended XYZ column layouts', () => {
  const reference = system.positions.map((p) => Array.from(p));
  const velocities = system.velocities.map((v) => Array.from(v));

  for (const order of [
    ['species', 'pos', 'velo'],
    ['pos', 'species'],
    ['id', 'velo', 'charge', 'pos', 'mask', 'species'],
    ['species', 'forces', 'pos', 'charge', 'velo', 'id'],
  ]) {
    it(`when Properties= orders the columns as ${order.join(', ')}, then positions${order.includes('velo') ? ' and velocities' : ''} are read from the right columns`, async () => {
      const frames = await readAll(bytes(extxyzText(system, order)), 'cols.extxyz');
      expect(frames.map((f) => Array.from(f.positions))).toEqual(reference);
      expect(frames[0].species).toEqual(system.species);
      if (order.includes('velo')) expect(frames.map((f) => Array.from(f.velocities!))).toEqual(velocities);
      else expect(frames[0].velocities).toBeUndefined();
    });
  }

  for (const name of ['vel', 'velocities']) {
    it(`when velocities are named "${name}", then they are read as velocities`, async () => {
      const frames = await readAll(bytes(extxyzText(system, ['species', 'pos', 'velo'], { velocityName: name })), 'v.extxyz');
      expect(Array.from(frames[2].velocities!)).toEqual(velocities[2]);
    });
  }

  it('when lines end in CR LF and columns are separated by tabs, then the values are the same', async () => {
    const text = extxyzText(system, ['species', 'pos', 'velo'], { newline: '\r\n', separator: '\t' });
    const frames = await readAll(bytes(text), 'win.extxyz');
    expect(frames.map((f) => Array.from(f.positions))).toEqual(reference);
    expect(frames[1].time).toBe(system.times[1]);
    expect(frames[0].species).toEqual(system.species);
  });

  it('when the file ends with blank lines or lacks a final newline, then no frame is lost or added', async () => {
    const text = extxyzText(system);
    expect(await positionsOf(`${text}\n\n   \n`, 'tail.extxyz')).toEqual(reference);
    expect(await positionsOf(text.trimEnd(), 'nofinal.extxyz')).toEqual(reference);
  });

  it('when Lattice is given in braces and keys are lower case, then the cell and time are still read', async () => {
    const text = extxyzText(system, ['species', 'pos'], { quoteLattice: false }).replace(/Lattice=/g, 'lattice=').replace(/Time=/g, 'time=');
    const frames = await readAll(bytes(text), 'lower.extxyz');
    expect(Array.from(frames[0].cell!)).toEqual(Array.from(system.cells[0]));
    expect(frames[2].time).toBe(system.times[2]);
  });
});

describe('extended XYZ comment lines', () => {
  const atoms = 'H 0 0 0\nO 1 1 1\n';

  it('when the comment carries other keys, quoted values with spaces and escaped quotes, and bare flags, then they are ignored', async () => {
    const comment = 'config_type="bulk \\"water\\" box" energy=-12.5 is_relaxed Properties=species:S:1:pos:R:3 Time = 2.5 pbc="T F T" Lattice="5 0 0 0 6 0 0 0 7"';
    const [frame] = await readAll(bytes(`2\n${comment}\n${atoms}`), 'keys.extxyz');
    expect(frame.time).toBe(2.5);
    expect(frame.pbc).toEqual([true, false, true]);
    expect(Array.from(frame.cell!)).toEqual([5, 0, 0, 0, 6, 0, 0, 0, 7]);
  });

  it('when Lattice= has no pbc=, then all three directions are periodic; when there is no Lattice, then there is no cell', async () => {
    const [withCell] = await readAll(bytes(`2\nLattice="5 0 0 0 5 0 0 0 5"\n${atoms}`), 'a.extxyz');
    expect(withCell.pbc).toEqual([true, true, true]);
    const [noCell] = await readAll(bytes(`2\nProperties=species:S:1:pos:R:3 Time=1\n${atoms}`), 'b.extxyz');
    expect(noCell.cell).toBeNull();
    expect(noCell.pbc).toBeUndefined();
  });

  it('when Time and Step are unquoted or quoted, then both are read', async () => {
    const cell = 'Lattice="5 0 0 0 5 0 0 0 5"';
    const frames = await readAll(bytes(`2\nTime="0.25" Step=100 ${cell}\n${atoms}2\nTime=0.5 step=200 ${cell}\n${atoms}`), 't.extxyz');
    expect(frames.map((f) => [f.time, f.step])).toEqual([[0.25, 100], [0.5, 200]]);
  });

  it('when species are lower case or labels, then they are kept as written', async () => {
    const [frame] = await readAll(bytes('3\nLattice="5 0 0 0 5 0 0 0 5"\nfe 0 0 0\nOW 1 1 1\nC12 2 2 2\n'), 'labels.extxyz');
    expect(frame.species).toEqual(['fe', 'OW', 'C12']);
  });
});

describe('numbers in atom lines', () => {
  it('when coordinates use signs, leading dots, exponents and Fortran D exponents, then they equal JavaScript Number()', async () => {
    const tokens = ['+1.5', '-.25', '.5e1', '1E-3', '-2.5e+2', '3.', '-0', '1.5D+02', '0.000123456789012345678', '123456789012345678901', '7e-310'];
    const lines = tokens.map((t) => `X ${t} ${t} ${t}`).join('\n');
    const [frame] = await readAll(bytes(`${tokens.length}\nplain\n${lines}\n`), 'n.xyz');
    const expected = tokens.map((t) => Number(t.replace('D', 'e')));
    expect(Array.from(frame.positions).filter((_, k) => k % 3 === 0)).toEqual(expected);
    expect(Object.is(frame.positions[18], -0)).toBe(true);
  });
});

describe('plain XYZ', () => {
  it('when the comment line is free text, then the file is detected as plain XYZ and counted', async () => {
    const text = '2\nwater molecule, energy -76.4\nO 0 0 0\nH 0.96 0 0\n';
    const info = await inspectTrajectory(chunked(bytes(text)), 'w.txt');
    expect(info.format).toBe('xyz');
    expect(info.speciesCounts).toEqual({ O: 1, H: 1 });
  });

  it('when atom lines carry extra columns after x y z, then the extra columns are ignored', async () => {
    const [frame] = await readAll(bytes('2\n\nO 0 0 0 -0.8 extra\nH 0.96 0 0 0.4 extra\n'), 'extra.xyz');
    expect(Array.from(frame.positions)).toEqual([0, 0, 0, 0.96, 0, 0]);
  });

  it('when the comment line is empty and the header has surrounding spaces, then the frames are read', async () => {
    const frames = await readAll(bytes('  1  \n\nAr 1 2 3\n  1\n\nAr 4 5 6\n'), 'ar.xyz');
    expect(frames.map((f) => Array.from(f.positions))).toEqual([[1, 2, 3], [4, 5, 6]]);
  });
});

describe('PDB', () => {
  const atom = (record: string, name: string, x: number, y: number, z: number, element = '') =>
    `${record.padEnd(6)}${'1'.padStart(5)} ${name} RES A   1    ${x.toFixed(3).padStart(8)}${y.toFixed(3).padStart(8)}${z.toFixed(3).padStart(8)}  1.00  0.00          ${element.padStart(2)}`;

  it('when CRYST1 gives a triclinic cell, then the lattice vectors have those lengths and angles with a along x', async () => {
    const text = `CRYST1   10.000   12.000   14.000  80.00 100.00 110.00 P 1           1\n${atom('ATOM', ' O  ', 1, 2, 3, 'O')}\nEND\n`;
    const [frame] = await readAll(bytes(text), 'tri.pdb');
    const cell = Array.from(frame.cell!);
    const length = (k: number) => Math.hypot(cell[3 * k], cell[3 * k + 1], cell[3 * k + 2]);
    const angle = (i: number, j: number) =>
      (Math.acos((cell[3 * i] * cell[3 * j] + cell[3 * i + 1] * cell[3 * j + 1] + cell[3 * i + 2] * cell[3 * j + 2]) / (length(i) * length(j))) * 180) / Math.PI;
    expect([length(0), length(1), length(2)].map((x) => x.toFixed(9))).toEqual(['10.000000000', '12.000000000', '14.000000000']);
    expect([angle(1, 2), angle(0, 2), angle(0, 1)].map((x) => x.toFixed(9))).toEqual(['80.000000000', '100.000000000', '110.000000000']);
    expect([cell[1], cell[2], cell[5]]).toEqual([0, 0, 0]);
  });

  it('when CRYST1 is the 1 1 1 90 90 90 placeholder, then there is no cell', async () => {
    const text = `CRYST1    1.000    1.000    1.000  90.00  90.00  90.00 P 1           1\n${atom('ATOM', ' O  ', 1, 2, 3, 'O')}\n`;
    const [frame] = await readAll(bytes(text), 'nmr.pdb');
    expect(frame.cell).toBeNull();
  });

  it('when models repeat or change their CRYST1 record, then each frame has its own cell with the values of the record before it', async () => {
    const cryst1 = (a: number) => `CRYST1${a.toFixed(3).padStart(9)}${a.toFixed(3).padStart(9)}${a.toFixed(3).padStart(9)}  90.00  90.00  90.00 P 1           1`;
    const model = (m: number, box: string) => `MODEL     ${String(m).padStart(4)}\n${box}\n${atom('ATOM', ' O  ', m, 0, 0, 'O')}\nENDMDL\n`;
    const placeholder = 'CRYST1    1.000    1.000    1.000  90.00  90.00  90.00 P 1           1';
    const text = [model(1, cryst1(20)), model(2, cryst1(20)), model(3, cryst1(25)), model(4, placeholder), model(5, placeholder), model(6, cryst1(20))].join('');
    const seen: (number[] | null)[] = [];
    const opened = await openTrajectory(chunked(bytes(text)), 'boxes.pdb');
    for await (const frame of opened.frames) {
      seen.push(frame.cell && Array.from(frame.cell));
      // A consumer that scribbles on one frame's cell must not change the next frame's.
      frame.cell?.fill(99);
    }
    const cube = (a: number) => [a, 0, 0, 0, a, 0, 0, 0, a];
    expect(seen).toEqual([cube(20), cube(20), cube(25), null, null, cube(20)]);
  });

  it('when element columns are blank, then the element comes from the atom name, including HETATM records', async () => {
    const text = [
      atom('ATOM', ' CA ', 0, 0, 0),
      atom('HETATM', 'FE  ', 1, 1, 1),
      atom('ATOM', 'HG12', 2, 2, 2),
      atom('ATOM', '1HB ', 3, 3, 3),
      atom('HETATM', 'CL  ', 4, 4, 4, 'Cl'),
    ].join('\n');
    const [frame] = await readAll(bytes(`${text}\nEND\n`), 'names.pdb');
    expect(frame.species).toEqual(['C', 'Fe', 'H', 'H', 'Cl']);
  });

  it('when frames are separated by END instead of MODEL records, then each block is a frame', async () => {
    const text = `${atom('ATOM', ' O  ', 1, 2, 3, 'O')}\nEND\n${atom('ATOM', ' O  ', 4, 5, 6, 'O')}\nEND\n`;
    const frames = await readAll(bytes(text), 'end.pdb');
    expect(frames.map((f) => Array.from(f.positions))).toEqual([[1, 2, 3], [4, 5, 6]]);
  });

  it('when coordinates fill their columns with no blank between them, then each is read from its own columns, sign included', async () => {
    const line = `ATOM      1  O   HOH A   1    -999.999-888.888-777.777  1.00  0.00           O`;
    const [frame] = await readAll(bytes(`${line}\nEND\n`), 'wide.pdb');
    expect(Array.from(frame.positions)).toEqual([-999.999, -888.888, -777.777]);
  });

  it('when an atom changes element between models, then each frame reports its own species, also when frames in between are skipped', async () => {
    const models = (elements: string[][]) =>
      elements.map((model, m) => `MODEL     ${String(m + 1).padStart(4)}\n${model.map((el, a) => atom('ATOM', ` ${el}  `, m, a, 0, el)).join('\n')}\nENDMDL\n`).join('');
    const text = models([['O', 'H'], ['O', 'H'], ['N', 'H'], ['N', 'H']]);
    expect((await readAll(bytes(text), 'swap.pdb')).map((f) => f.species)).toEqual([['O', 'H'], ['O', 'H'], ['N', 'H'], ['N', 'H']]);
    const strided = await readAll(bytes(text), 'swap.pdb', { wants: (i) => i % 2 === 1 });
    expect(strided.map((f) => [f.index, f.species])).toEqual([[1, ['O', 'H']], [3, ['N', 'H']]]);
  });

  it('when the atom name changes between models but the element does not, then the species stay the same', async () => {
    const text = `MODEL        1\n${atom('ATOM', ' CA ', 0, 0, 0)}\nENDMDL\nMODEL        2\n${atom('ATOM', ' CB ', 1, 1, 1)}\nENDMDL\n`;
    const frames = await readAll(bytes(text), 'rename.pdb');
    expect(frames.map((f) => f.species)).toEqual([['C'], ['C']]);
    expect(Array.from(frames[1].positions)).toEqual([1, 1, 1]);
  });

  it('when lines end in CR LF and TER and CONECT records are present, then only atoms are read', async () => {
    const text = `MODEL        1\r\n${atom('ATOM', ' N  ', 1, 2, 3, 'N')}\r\nTER\r\nCONECT    1    2\r\nENDMDL\r\n`;
    const [frame] = await readAll(bytes(text), 'crlf.pdb');
    expect(frame.species).toEqual(['N']);
    expect(Array.from(frame.positions)).toEqual([1, 2, 3]);
  });
});
