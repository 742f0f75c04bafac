/**
 * What inspection reports about an upload, and how assembly turns frames
 * into the engine's arrays in Å, Å/ps and ps.
 */
import { describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { inspectTrajectory, type InspectProgress } from '../../../server/formats/inspect.ts';
import { assembleTrajectory } from '../../../server/formats/assemble.ts';
import { LENGTH_TO_ANGSTROM, TIME_TO_PS, VELOCITY_TO_ANGSTROM_PER_PS } from '../../../server/formats/units.ts';
import { openTrajectory } from '../../../server/formats/open-trajectory.ts';
import { field, parseFieldBytes, parseNumberBytes } from '../../../server/formats/number-bytes.ts';
import { bytes, chunked, extxyzText, gzip, makeSystem, random, readAll, xyzText, zip } from './synthetic.ts';

describe('inspection', () => {
  const system = makeSystem(10, 8, 2, { cellChanges: true });
  const text = bytes(extxyzText(system));

  it('when an extended XYZ is inspected, then it reports counts, species, first cell, cell changes, velocities and time step', async () => {
    const progress: InspectProgress[] = [];
    const info = await inspectTrajectory(chunked(text), 'run.extxyz', { sha256: true }, (p) => progress.push(p));
    expect(info).toMatchObject({
      format: 'extxyz',
      compression: 'none',
      atoms: 10,
      frames: 8,
      speciesCounts: { O: 2, H: 4, Na: 2, Cl: 2 },
      cell: Array.from(system.cells[0]),
      cellChanges: true,
      hasVelocities: true,
      timeStep: 0.5,
      timeUneven: false,
      firstTime: 0,
      bytes: text.length,
      pbc: [true, true, true],
    });
    expect(info.sha256).toBe(createHash('sha256').update(text).digest('hex'));
    expect(info.frameOffsets.map((o) => o.index)).toEqual([0, 1, 2, 3, 4, 5, 6, 7]);
    expect(text.subarray(info.frameOffsets[3].offset, info.frameOffsets[3].offset + 3).toString()).toBe('10\n');
    expect(progress.at(-1)).toEqual({ rawBytes: text.length, bytes: text.length, frames: 8 });
  });

  it('when a plain XYZ inside a zip is inspected, then it reports the entry, no cell, no velocities and no time', async () => {
    const info = await inspectTrajectory(chunked(zip({ 'data/run.xyz': bytes(xyzText(system)) })), 'upload.zip');
    expect(info).toMatchObject({ format: 'xyz', compression: 'zip', entryName: 'data/run.xyz', cell: null, cellChanges: false, hasVelocities: false });
    expect(info.timeStep).toBeUndefined();
    expect(info.firstTime).toBeUndefined();
  });

  it('when gzip is detected from its magic bytes, then the name does not matter', async () => {
    const info = await inspectTrajectory(chunked(gzip(text)), 'no-extension');
    expect([info.format, info.compression, info.frames]).toEqual(['extxyz', 'gzip', 8]);
  });

  it('when frame times are unevenly spaced, then inspection flags it', async () => {
    const uneven = extxyzText(system).replace('Time=1.5 ', 'Time=1.6 ');
    const info = await inspectTrajectory(chunked(bytes(uneven)), 'u.extxyz');
    expect(info.timeUneven).toBe(true);
  });
});

describe('assembly for the engine', () => {
  const system = makeSystem(6, 5, 9);

  it('when units are nm, ps and nm/ps, then positions, cells and velocities are scaled by 10 into Float32 arrays', async () => {
    const frames = await readAll(bytes(extxyzText(system)), 'a.extxyz');
    const trajectory = await assembleTrajectory(frames, { length: 'nm', time: 'ps', velocity: 'nm/ps' }, { atoms: 6, frames: 5 });
    expect(trajectory.nAtoms).toBe(6);
    expect(trajectory.nFrames).toBe(5);
    expect(trajectory.boundary).toBe('periodic');
    expect(trajectory.positions).toBeInstanceOf(Float32Array);
    expect(trajectory.positions[3 * 6 * 4 + 7]).toBe(Math.fround(system.positions[4][7] * 10));
    expect(trajectory.velocities![5]).toBe(Math.fround(system.velocities[0][5] * 10));
    expect(Array.from(trajectory.cells!.subarray(9, 18))).toEqual(Array.from(system.cells[1]).map((x) => x * 10));
    expect(Array.from(trajectory.times)).toEqual(system.times);
  });

  it('when times are in fs, then they become ps', async () => {
    const frames = await readAll(bytes(extxyzText(system)), 'a.extxyz');
    const trajectory = await assembleTrajectory(frames, { length: 'angstrom', time: 'fs', velocity: 'angstrom/fs' });
    expect(Array.from(trajectory.times)).toEqual(system.times.map((t) => t * 1e-3));
    expect(trajectory.velocities![0]).toBe(Math.fround(system.velocities[0][0] * 1000));
  });

  it('when the file has no times, then times are frame index × the given time step; without a step it is refused', async () => {
    const frames = await readAll(bytes(xyzText(system)), 'a.xyz');
    const trajectory = await assembleTrajectory(frames, { length: 'bohr', time: 'ps', velocity: 'bohr/au', timeStepPs: 0.002 });
    expect(Array.from(trajectory.times)).toEqual([0, 0.002, 0.004, 0.006, 0.008]);
    expect(trajectory.cells).toBeNull();
    expect(trajectory.boundary).toBe('none');
    expect(trajectory.positions[1]).toBe(Math.fround(system.positions[0][1] * LENGTH_TO_ANGSTROM.bohr));
    await expect(assembleTrajectory(frames, { length: 'angstrom', time: 'ps', velocity: 'angstrom/ps' })).rejects.toThrow(
      /frames carry no time; a time step \(timeStepPs\) is needed/,
    );
  });

  it('when inspection counted fewer frames than the stream holds, then assembly refuses instead of overrunning', async () => {
    const frames = await readAll(bytes(xyzText(system)), 'a.xyz');
    await expect(
      assembleTrajectory(frames, { length: 'angstrom', time: 'ps', velocity: 'angstrom/ps', timeStepPs: 1 }, { atoms: 6, frames: 3 }),
    ).rejects.toThrow(/frame 4: more frames than the 3 inspection found/);
  });

  it('when periodic boundaries are requested without a cell, then assembly refuses', async () => {
    const frames = await readAll(bytes(xyzText(system)), 'a.xyz');
    await expect(
      assembleTrajectory(frames, { length: 'angstrom', time: 'ps', velocity: 'angstrom/ps', timeStepPs: 1, boundary: 'periodic' }),
    ).rejects.toThrow(/periodic boundary requested but the trajectory has no cell/);
  });
});

describe('unit tables', () => {
  it('when converting, then the factors follow from their definitions', () => {
    expect(LENGTH_TO_ANGSTROM.bohr).toBeCloseTo(0.529177210903, 12);
    expect(TIME_TO_PS.au).toBeCloseTo(2.4188843265857e-5, 15);
    expect(VELOCITY_TO_ANGSTROM_PER_PS['m/s']).toBeCloseTo(0.01, 15);
    expect(VELOCITY_TO_ANGSTROM_PER_PS['bohr/au'] / 21876.912636).toBeCloseTo(1, 8);
  });
});

describe('number parsing from bytes', () => {
  it('when 20 000 random decimal strings in many forms are parsed, then every result is bit-identical to Number()', () => {
    const rnd = random(42);
    for (let k = 0; k < 20_000; k++) {
      const digits = Math.floor(rnd() * 20) + 1;
      let mantissa = '';
      for (let d = 0; d < digits; d++) mantissa += Math.floor(rnd() * 10);
      const dot = Math.floor(rnd() * (digits + 1));
      let text = `${mantissa.slice(0, dot)}.${mantissa.slice(dot)}`;
      if (rnd() < 0.3) text += `${rnd() < 0.5 ? 'e' : 'E'}${rnd() < 0.5 ? '-' : '+'}${Math.floor(rnd() * 40)}`;
      if (rnd() < 0.5) text = `-${text}`;
      const buf = Buffer.from(text);
      expect(Object.is(parseNumberBytes(buf, 0, buf.length), Number(text)), text).toBe(true);
    }
  });

  it('when random tokens are read in one pass from inside a line, then value and end match a token scan and parseNumberBytes', () => {
    const rnd = random(7);
    const forms = ['', '.', '-', '+', '1e', '1.2.3', '0x1A', 'NaN', '1_0', '--1', '1e+', '12.5D+03', '+.5', '7.', '-0.000000000000000000000001234'];
    for (let k = 0; k < 20_000; k++) {
      let token: string;
      if (rnd() < 0.1) token = forms[Math.floor(rnd() * forms.length)]!;
      else {
        const digits = Math.floor(rnd() * 24) + 1;
        let mantissa = '';
        for (let d = 0; d < digits; d++) mantissa += Math.floor(rnd() * 10);
        const dot = Math.floor(rnd() * (digits + 2));
        token = dot > digits ? mantissa : `${mantissa.slice(0, dot)}.${mantissa.slice(dot)}`;
        if (rnd() < 0.2) token += `${rnd() < 0.5 ? 'e' : 'E'}${rnd() < 0.5 ? '-' : ''}${Math.floor(rnd() * 40)}`;
        if (rnd() < 0.5) token = `${rnd() < 0.8 ? '-' : '+'}${token}`;
      }
      if (token === '') continue;
      const after = ['', ' ', '\t', '  9.0'][Math.floor(rnd() * 4)]!;
      const line = Buffer.from(`Ar ${token}${after}`);
      const expected = parseNumberBytes(line, 3, 3 + token.length);
      const value = parseFieldBytes(line, 3, line.length);
      expect(Object.is(value, expected), token).toBe(true);
      expect(field.end, token).toBe(3 + token.length);
    }
  });

  it('when a token is not a decimal number, then the result is NaN', () => {
    for (const text of ['', '.', '-', '1e', '1.2.3', '0x1A', 'Infinity', 'NaN', '1_0', '--1', '1e+']) {
      const buf = Buffer.from(text);
      expect(parseNumberBytes(buf, 0, buf.length), text).toBeNaN();
    }
  });
});

describe('detection without file names', () => {
  it('when PDB, XYZ and extended XYZ arrive under a meaningless name, then each is recognised from content', async () => {
    const system = makeSystem(2, 1);
    const xyz = await openTrajectory(chunked(bytes(xyzText(system))), 'upload');
    const ext = await openTrajectory(chunked(bytes(extxyzText(system))), 'upload.txt');
    const pdb = await openTrajectory(chunked(bytes('REMARK x\nATOM      1  O   HOH A   1       1.000   2.000   3.000  1.00  0.00           O\n')), 'x.xyz');
    expect([xyz.format, ext.format, pdb.format]).toEqual(['xyz', 'extxyz', 'pdb']);
    await Promise.all([xyz, ext, pdb].map((o) => o.frames.return(undefined)));
  });

  it('when the first lines sit past the first 64 KiB of a 1 MB read, then they still decide the format', async () => {
    const system = makeSystem(2, 1);
    const blanks = '\n'.repeat(70_000);
    const longComment = `${' '.repeat(70_000)}Lattice="9 0 0 0 9 0 0 0 9" Properties=species:S:1:pos:R:3`;
    const late = await openTrajectory(chunked(bytes(blanks + extxyzText(system)), [1 << 20]), 'upload');
    const across = await openTrajectory(chunked(bytes(`2\n${longComment}\nO 0 0 0\nH 1 1 1\n`), [1 << 20]), 'upload');
    expect([late.format, across.format]).toEqual(['extxyz', 'extxyz']);
    await Promise.all([late, across].map((o) => o.frames.return(undefined)));
  });
});

describe('assembly without a prior inspection', () => {
  it('when an atom changes species between frames, then assembly refuses it naming the atom and the frame', async () => {
    const text = '2\nTime=0\nAr 0 0 0\nKr 1 1 1\n2\nTime=1\nAr 0 0 0\nXe 1 1 1\n';
    const opened = await openTrajectory(chunked(bytes(text)), 'swap.xyz');
    await expect(assembleTrajectory(opened.frames, { length: 'angstrom', time: 'ps', velocity: 'angstrom/ps' }, undefined, 'swap.xyz'))
      .rejects.toThrow(/swap\.xyz, frame 2: species of atom 2 changes from Kr to Xe/);
  });
});
