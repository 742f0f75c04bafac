/**
 * What the readers refuse, and how they say so: every message names what is
 * wrong and where (file, frame, line, or HDF5 path). Each file is built
 * here from a valid synthetic trajectory by one deliberate defect.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeFile } from 'node:fs/promises';
import { inspectTrajectory } from '../../../server/formats/inspect.ts';
import { bytes, chunked, failure, gzip, h5, makeSystem, tempDir, xyzText, zip, type TempDir } from './synthetic.ts';

const system = makeSystem(4, 3);
/** Lines of a 4-atom, 3-frame XYZ: frame f starts at line 6f+1; its atoms are lines 6f+3 … 6f+6. */
const xyzLines = xyzText(system).trimEnd().split('\n');
const withLines = (edit: (lines: string[]) => void) => {
  const copy = xyzLines.slice();
  edit(copy);
  return bytes(`${copy.join('\n')}\n`);
};
const extLines = (comment: (f: number) => string, atom: (f: number, a: number) => string = (f, a) => xyzLines[6 * f + 2 + a]) => {
  let out = '';
  for (let f = 0; f < 3; f++) {
    out += `4\n${comment(f)}\n`;
    for (let a = 0; a < 4; a++) out += `${atom(f, a)}\n`;
  }
  return bytes(out);
};
const good = 'Lattice="10 0 0 0 10 0 0 0 10" Properties=species:S:1:pos:R:3';

const inspect = (data: Uint8Array, name: string, limits = {}) =>
  failure(() => inspectTrajectory(chunked(data), name, limits));

let dir: TempDir;
beforeAll(async () => {
  dir = await tempDir();
});
afterAll(async () => {
  await dir.remove();
});

describe('XYZ frames that do not add up', () => {
  it('when the file ends inside the last frame, then it says the file is truncated in frame 3 with the header line', async () => {
    const message = await inspect(withLines((l) => l.splice(-2)), 'cut.xyz');
    expect(message).toMatch(/^cut\.xyz, frame 3: file ends inside frame 3: its header \(line 13\) says 4 atoms but only 2 atom lines follow/);
  });

  it('when frame 2 has fewer atom lines than its header says, then it names frame 2 and the line where the next header appears', async () => {
    const message = await inspect(withLines((l) => l.splice(10, 1)), 'short.xyz');
    expect(message).toMatch(/^short\.xyz, frame 2, line 12: frame 2 has fewer atom lines than its header says: expected 4, found 3/);
  });

  it('when frame 1 has more atom lines than its header says, then it points at the extra line where frame 2 should start', async () => {
    const message = await inspect(withLines((l) => l.splice(6, 0, 'H 1.0 2.0 3.0')), 'long.xyz');
    expect(message).toMatch(/^long\.xyz, frame 2, line 7: expected the atom count that starts frame 2, found "H 1\.0 2\.0 3\.0".*more atom lines/);
  });

  it('when a later frame has a different atom count, then it refuses the changed count at that frame', async () => {
    const message = await inspect(withLines((l) => { l[6] = '3'; l.splice(8, 1); }), 'count.xyz');
    expect(message).toMatch(/^count\.xyz, frame 2, line 7: frame 2 has 3 atoms but earlier frames have 4/);
  });

  it('when a frame says it has 0 atoms, then the header is refused', async () => {
    expect(await inspect(bytes('0\nempty\n'), 'zero.xyz')).toMatch(/^zero\.xyz, frame 1, line 1: header says the frame has 0 atoms/);
  });
});

describe('atom lines that are not numbers', () => {
  it('when a coordinate is a word, then it quotes the word, the axis, the atom, frame and line', async () => {
    const message = await inspect(withLines((l) => { l[10] = 'Na 1.0 abc 3.0'; }), 'word.xyz');
    expect(message).toMatch(/^word\.xyz, frame 2, line 11: atom 3 of 4: y "abc" is not a finite number/);
  });

  it('when a coordinate is NaN, then it is refused as not finite', async () => {
    const message = await inspect(withLines((l) => { l[2] = 'O nan 1.0 2.0'; }), 'nan.xyz');
    expect(message).toMatch(/^nan\.xyz, frame 1, line 3: atom 1 of 4: x "nan" is not a finite number/);
  });

  it('when a coordinate overflows to infinity, then it is refused as not finite', async () => {
    const message = await inspect(withLines((l) => { l[17] = 'Cl 1.0 2.0 1e999'; }), 'inf.xyz');
    expect(message).toMatch(/^inf\.xyz, frame 3, line 18: atom 4 of 4: z "1e999" is not a finite number/);
  });

  it('when an atom line has no species (only x y z), then it says the line has too few columns', async () => {
    const message = await inspect(withLines((l) => { l[3] = '1.0 2.0 3.0'; }), 'nospecies.xyz');
    expect(message).toMatch(/^nospecies\.xyz, frame 1, line 4: atom 2 of 4: line has 3 columns, needs at least 4 \(species x y z\)/);
  });

  it('when an atom line is blank, then it says the line has 0 columns', async () => {
    const message = await inspect(withLines((l) => { l[4] = '   '; }), 'blank.xyz');
    expect(message).toMatch(/^blank\.xyz, frame 1, line 5: atom 3 of 4: line has 0 columns/);
  });
});

describe('impossible sizes are refused before anything is allocated', () => {
  it('when a header claims more atoms than the limit, then it is refused at line 1', async () => {
    const message = await inspect(bytes('999999999999\nx\nH 0 0 0\n'), 'huge.xyz');
    expect(message).toMatch(/^huge\.xyz, frame 1, line 1: header claims 999999999999 atoms, more than the limit of 50000000/);
  });

  it('when a header claims more atoms than the remaining bytes could hold, then it is refused', async () => {
    const path = dir.file('lying.xyz');
    await writeFile(path, '40000000\ncomment\nH 0 0 0\n');
    const message = await failure(() => inspectTrajectory(path, 'lying.xyz'));
    expect(message).toMatch(/^lying\.xyz, frame 1, line 1: header claims 40000000 atoms but only \d+ bytes remain/);
  });

  it('when a line is longer than the line limit, then the data is called binary or corrupt', async () => {
    const message = await inspect(bytes(`3\n${'x'.repeat(5000)}`), 'longline.xyz', { maxLineBytes: 1000 });
    expect(message).toMatch(/^longline\.xyz, line 2: line is longer than 1000 bytes/);
  });
});

describe('files that are not trajectories at all', () => {
  it('when the file is empty, then it says so', async () => {
    expect(await inspect(new Uint8Array(0), 'empty.xyz')).toBe('empty.xyz: file is empty');
  });

  it('when the file holds only blank lines, then it says there are no frames', async () => {
    expect(await inspect(bytes('\n  \n\n'), 'blank.xyz')).toMatch(/^blank\.xyz: file holds only blank lines, no frames/);
  });

  it('when the file is binary garbage, then it is refused as binary with the offset of the first NUL', async () => {
    const garbage = new Uint8Array(4096).map((_, k) => (k * 131 + 7) % 256);
    expect(await inspect(garbage, 'garbage.xyz')).toMatch(/^garbage\.xyz: binary data \(NUL byte at offset \d+\)/);
  });

  it('when the text is neither XYZ nor PDB, then it quotes the first line and the name hint', async () => {
    const message = await inspect(bytes('hello world\n'), 'notes.pdb');
    expect(message).toMatch(/^notes\.pdb, line 1: not a recognised trajectory: .*found "hello world" \(the name suggests pdb\)/);
  });
});

describe('extended XYZ comment lines', () => {
  it('when Lattice= does not hold 9 numbers, then it names the frame and the comment line', async () => {
    const message = await inspect(extLines((f) => (f === 1 ? 'Lattice="10 0 0 10 0 0" Properties=species:S:1:pos:R:3' : good)), 'lattice.extxyz');
    expect(message).toMatch(/^lattice\.extxyz, frame 2, line 8: Lattice="10 0 0 10 0 0" must hold 9 finite numbers .* found 6 values/);
  });

  it('when Properties= has no pos column, then it says positions are missing', async () => {
    const message = await inspect(extLines(() => 'Lattice="10 0 0 0 10 0 0 0 10" Properties=species:S:1:vel:R:3'), 'nopos.extxyz');
    expect(message).toMatch(/^nopos\.extxyz, frame 1, line 2: Properties="species:S:1:vel:R:3" has no positions column \(pos:R:3\)/);
  });

  it('when Properties= has no species column, then it says species are missing', async () => {
    const message = await inspect(
      extLines(() => 'Lattice="10 0 0 0 10 0 0 0 10" Properties=pos:R:3:Z:I:1', (f, a) => `1.0 2.0 3.0 ${a + 1}`),
      'nospecies.extxyz',
    );
    expect(message).toMatch(/^nospecies\.extxyz, frame 1, line 2: Properties="pos:R:3:Z:I:1" has no species column/);
  });

  it('when Properties= is not made of name:type:count triples, then it says so', async () => {
    const message = await inspect(extLines(() => 'Properties=species:S:1:pos:R'), 'triples.extxyz');
    expect(message).toMatch(/^triples\.extxyz, frame 1, line 2: Properties="species:S:1:pos:R" is not a list of name:type:count triples/);
  });

  it('when atom lines have fewer columns than Properties= declares, then it gives the needed column list', async () => {
    const message = await inspect(extLines(() => `${good}:velo:R:3`), 'fewcols.extxyz');
    expect(message).toMatch(/^fewcols\.extxyz, frame 1, line 3: atom 1 of 4: line has 4 columns, needs at least 7 \(species pos×3 velo×3\)/);
  });

  it('when a quoted value is never closed, then the comment line is refused', async () => {
    const message = await inspect(extLines(() => 'Lattice="10 0 0 0 10 0 0 0 10 Properties=species:S:1:pos:R:3'), 'quote.extxyz');
    expect(message).toMatch(/^quote\.extxyz, frame 1, line 2: comment line has an unclosed "/);
  });

  it('when pbc= is not three booleans, then it says so', async () => {
    const message = await inspect(extLines((f) => `${good} pbc="T maybe T"`), 'pbc.extxyz');
    expect(message).toMatch(/^pbc\.extxyz, frame 1, line 2: pbc="T maybe T" must be three of T\/F/);
  });

  it('when Time= is not a number, then it names the frame', async () => {
    const message = await inspect(extLines((f) => `${good} Time=${f === 2 ? 'soon' : f}`), 'time.extxyz');
    expect(message).toMatch(/^time\.extxyz, frame 3, line 14: Time="soon" is not a finite number/);
  });

  it('when an atom changes species between frames, then inspection refuses the trajectory at that frame', async () => {
    const message = await inspect(extLines(() => good, (f, a) => (f === 2 && a === 1 ? 'O 1 2 3' : xyzLines[2 + a])), 'swap.extxyz');
    expect(message).toMatch(/^swap\.extxyz, frame 3: species of atom 2 changes from H to O/);
  });
});

describe('PDB records', () => {
  const atom = (serial: number, element: string, x: string, y = '   1.000', z = '   2.000') =>
    `ATOM  ${String(serial).padStart(5)}  ${element.padEnd(3)} MOL A   1    ${x}${y}${z}  1.00  0.00          ${element.padStart(2)}`;

  it('when there is no ATOM or HETATM record, then it says the file holds no coordinates', async () => {
    expect(await inspect(bytes('HEADER    nothing here\nREMARK 1\nEND\n'), 'empty.pdb')).toMatch(
      /^empty\.pdb: no ATOM or HETATM records/,
    );
  });

  it('when an ATOM record is cut before column 54, then it names the line and the columns needed', async () => {
    const text = `MODEL        1\n${atom(1, 'O', '   0.000')}\n${atom(2, 'H', '   1.000').slice(0, 45)}\nENDMDL\n`;
    expect(await inspect(bytes(text), 'cut.pdb')).toMatch(/^cut\.pdb, frame 1, line 3: ATOM\/HETATM record is 45 characters long; coordinates need columns 31–54/);
  });

  it('when a coordinate column holds text, then it quotes it with its columns', async () => {
    const text = `MODEL        1\n${atom(1, 'O', '   0.000')}\nENDMDL\nMODEL        2\n${atom(1, 'O', '  x.yz  ')}\nENDMDL\n`;
    expect(await inspect(bytes(text), 'text.pdb')).toMatch(/^text\.pdb, frame 2, line 5: x in columns 31–38 is "x\.yz", not a finite number/);
  });

  it('when only the z column fails, then it is the one named, with its columns', async () => {
    const text = `${atom(1, 'O', '   0.000', '   1.000', '  1.2.3 ')}\nEND\n`;
    expect(await inspect(bytes(text), 'zed.pdb')).toMatch(/^zed\.pdb, frame 1, line 1: z in columns 47–54 is "1\.2\.3", not a finite number/);
  });

  it('when a coordinate overflows to infinity, then it is refused as not finite', async () => {
    const text = `MODEL        1\n${atom(1, 'O', '   0.000', ' 9e999  ')}\nENDMDL\n`;
    expect(await inspect(bytes(text), 'huge.pdb')).toMatch(/^huge\.pdb, frame 1, line 2: y in columns 39–46 is "9e999", not a finite number/);
  });

  it('when models have different atom counts, then it names the model that differs', async () => {
    const text = `MODEL        1\n${atom(1, 'O', '   0.000')}\n${atom(2, 'H', '   1.000')}\nENDMDL\nMODEL        2\n${atom(1, 'O', '   0.000')}\nENDMDL\n`;
    expect(await inspect(bytes(text), 'models.pdb')).toMatch(/^models\.pdb, frame 2, line 5: frame 2 has 1 atoms but earlier frames have 2/);
  });

  it('when CRYST1 does not hold numbers, then it quotes the record', async () => {
    const text = `CRYST1   abc   10.000   10.000  90.00  90.00  90.00 P 1\n${atom(1, 'O', '   0.000')}\nEND\n`;
    expect(await inspect(bytes(text), 'cryst.pdb')).toMatch(/^cryst\.pdb, frame 1, line 1: CRYST1 record must give a b c α β γ as numbers/);
  });
});

describe('compressed uploads', () => {
  const xyz = bytes(xyzText(system));

  it('when a zip holds two trajectories, then it names both and asks for one', async () => {
    const message = await inspect(zip({ 'a.xyz': xyz, 'b.xyz': xyz }), 'two.zip');
    expect(message).toBe('two.zip: zip holds more than one trajectory ("a.xyz" and "b.xyz"); upload one file per trajectory');
  });

  it('when a zip holds only a folder and macOS bookkeeping, then it says there is no trajectory', async () => {
    const message = await inspect(zip({ 'run/': new Uint8Array(0), '__MACOSX/run/._a.xyz': bytes('junk') }), 'none.zip');
    expect(message).toBe('none.zip: zip holds no trajectory file');
  });

  it('when a zip entry climbs out with "..", then the archive is refused', async () => {
    expect(await inspect(zip({ '../../etc/a.xyz': xyz }), 'climb.zip')).toMatch(/^climb\.zip: zip entry name "\.\.\/\.\.\/etc\/a\.xyz" climbs out/);
  });

  it('when a zip entry has an absolute path, then the archive is refused', async () => {
    expect(await inspect(zip({ '/tmp/a.xyz': xyz }), 'abs.zip')).toMatch(/^abs\.zip: zip entry name "\/tmp\/a\.xyz" is an absolute path/);
  });

  it('when a zip entry name has a backslash, then the archive is refused', async () => {
    expect(await inspect(zip({ 'run\\a.xyz': xyz }), 'slash.zip')).toMatch(/^slash\.zip: zip entry name "run\\a\.xyz" contains a backslash/);
  });

  it('when a zip entry name has a NUL byte, then the archive is refused', async () => {
    expect(await inspect(zip({ 'a.xyz\0.txt': xyz }), 'nul.zip')).toMatch(/^nul\.zip: zip entry name "a\.xyz\\0\.txt" contains a NUL byte/);
  });

  it('when a zip expands beyond the ratio limit, then it stops and calls it a possible bomb', async () => {
    const message = await inspect(zip({ 'a.xyz': new Uint8Array(30_000_000).fill(32) }), 'bomb.zip', { maxCompressionRatio: 50 });
    expect(message).toMatch(/^bomb\.zip: zip data expands more than 50× .*possible decompression bomb/);
  });

  it('when a gzip expands beyond the size limit, then it stops at the limit', async () => {
    const message = await inspect(gzip(bytes(xyzText(makeSystem(50, 40)))), 'big.xyz.gz', { maxDecompressedBytes: 20_000 });
    expect(message).toMatch(/^big\.xyz\.gz: gzip data expands beyond the limit of 20000 bytes/);
  });

  it('when a gzip expands beyond the ratio limit, then it stops and calls it a possible bomb', async () => {
    const blankTail = Buffer.alloc(20_000_000, 10);
    const message = await inspect(gzip(Buffer.concat([bytes('1\nc\nH 0 0 0\n'), blankTail])), 'bomb.gz', { maxCompressionRatio: 100 });
    expect(message).toMatch(/^bomb\.gz: gzip data expands more than 100× .*possible decompression bomb/);
  });

  it('when a gzip stream is cut short, then it says the gzip data is corrupt or truncated', async () => {
    const whole = gzip(bytes(xyzText(makeSystem(20, 20))));
    expect(await inspect(whole.subarray(0, whole.length - 100), 'cut.xyz.gz')).toMatch(/^cut\.xyz\.gz: gzip data is corrupt or truncated/);
  });

  it('when a zip archive is cut inside its entry, then it is refused as corrupt or truncated', async () => {
    const whole = zip({ 'a.xyz': bytes(xyzText(makeSystem(20, 20))) });
    expect(await inspect(whole.subarray(0, whole.length / 2), 'cut.zip')).toMatch(/^cut\.zip(\/a\.xyz)?: .*(truncated|corrupt)/);
  });

  it('when a trajectory inside a zip is bad, then the message names the archive and the entry, frame and line', async () => {
    const bad = withLines((l) => { l[8] = 'O 1 2'; });
    expect(await inspect(zip({ 'run/traj.xyz': bad }), 'up.zip')).toMatch(/^up\.zip\/run\/traj\.xyz, frame 2, line 9: atom 1 of 4: line has 3 columns/);
  });
});

describe('H5MD structure', () => {
  const h5Failure = async (name: string, build: (file: import('h5wasm').File) => void) => {
    const { File } = await h5();
    const path = dir.file(name);
    const file = new File(path, 'w');
    build(file);
    file.close();
    return failure(() => inspectTrajectory(path, name));
  };

  it('when there is no particles group, then it names the /particles path', async () => {
    const message = await h5Failure('noparticles.h5', (f) => { f.create_group('observables'); });
    expect(message).toBe('noparticles.h5, HDF5 path /particles: no particles group: not an H5MD trajectory');
  });

  it('when no particle group has a position, then it names the missing position path', async () => {
    const message = await h5Failure('nopos.h5', (f) => {
      const all = f.create_group('particles').create_group('all');
      all.create_group('velocity');
    });
    expect(message).toMatch(/^nopos\.h5, HDF5 path \/particles\/\{all\}\/position: no particle group has a position element/);
  });

  it('when position value has the wrong shape, then it gives the shape and the dataset path', async () => {
    const message = await h5Failure('shape.h5', (f) => {
      const position = f.create_group('particles').create_group('all').create_group('position');
      position.create_dataset({ name: 'value', data: new Float64Array(12), shape: [2, 6] });
    });
    expect(message).toMatch(/^shape\.h5, HDF5 path \/particles\/all\/position\/value: position value must have shape \[frames, atoms, 3\], found \[2, 6\]/);
  });

  it('when a position is NaN in frame 2, then it names frame 2, the atom and the dataset path', async () => {
    const message = await h5Failure('nan.h5', (f) => {
      const position = f.create_group('particles').create_group('all').create_group('position');
      const data = new Float64Array(2 * 2 * 3);
      data[9] = NaN;
      position.create_dataset({ name: 'value', data, shape: [2, 2, 3] });
    });
    expect(message).toMatch(/^nan\.h5, frame 2, HDF5 path \/particles\/all\/position\/value: atom 2 has a non-finite value \(NaN\)/);
  });

  it('when velocity has a different shape from position, then it names the velocity path', async () => {
    const message = await h5Failure('vel.h5', (f) => {
      const all = f.create_group('particles').create_group('all');
      all.create_group('position').create_dataset({ name: 'value', data: new Float64Array(12), shape: [2, 2, 3] });
      all.create_group('velocity').create_dataset({ name: 'value', data: new Float64Array(6), shape: [1, 2, 3] });
    });
    expect(message).toMatch(/^vel\.h5, HDF5 path \/particles\/all\/velocity\/value: velocity value has shape \[1, 2, 3\] but position has \[2, 2, 3\]/);
  });

  it('when a periodic box has no edges, then it names the edges path', async () => {
    const message = await h5Failure('edges.h5', (f) => {
      const all = f.create_group('particles').create_group('all');
      all.create_group('position').create_dataset({ name: 'value', data: new Float64Array(6), shape: [1, 2, 3] });
      const box = all.create_group('box');
      box.create_attribute('dimension', 3);
      box.create_attribute('boundary', ['periodic', 'periodic', 'periodic']);
    });
    expect(message).toBe('edges.h5, HDF5 path /particles/all/box/edges: box is periodic but has no edges');
  });

  it('when the HDF5 signature is followed by garbage, then it is refused as unreadable HDF5', async () => {
    const path = dir.file('broken.h5');
    await writeFile(path, Buffer.concat([Buffer.from([0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(2000, 7)]));
    expect(await failure(() => inspectTrajectory(path, 'broken.h5'))).toMatch(/^broken\.h5: not a readable HDF5 file/);
  });

  it('when species has a different atom count from position, then it names the species path', async () => {
    const message = await h5Failure('species.h5', (f) => {
      const g = f.create_group('particles').create_group('all');
      g.create_group('position').create_dataset({ name: 'value', data: new Float64Array(18), shape: [2, 3, 3] });
      g.create_dataset({ name: 'species', data: new Int32Array([1, 2]) });
    });
    expect(message).toMatch(/^species\.h5, HDF5 path \/particles\/all\/species: species has shape \[2\] but there are 3 atoms/);
  });
});

describe('values a 32-bit float cannot hold', () => {
  it('when an atom in frame 2 has x = 1e39, then inspection refuses it naming the file, frame, line, atom and value', async () => {
    // Frame 2 (f = 1) starts at line 7; its third atom is on line 7 + 2 + 2 = 11.
    const data = withLines((lines) => {
      const parts = lines[10]!.trim().split(/\s+/);
      parts[1] = '1e39';
      lines[10] = parts.join(' ');
    });
    const message = await inspect(data, 'far-away.xyz');
    expect(message).toMatch(/^far-away\.xyz, frame 2, line 11: atom 3 has position x = 1e\+39, which is not a finite number a 32-bit float can hold/);
  });

  it('when a velocity overflows a 32-bit float in extended XYZ, then it is refused naming the atom\'s line', async () => {
    const data = extLines(() => `${good.replace('pos:R:3', 'pos:R:3:vel:R:3')}`, (f, a) => `${xyzLines[6 * f + 2 + a]} 0 ${f === 2 && a === 0 ? '-2e40' : '0'} 0`);
    const message = await inspect(data, 'hot.extxyz');
    expect(message).toMatch(/hot\.extxyz, frame 3, line 15: atom 1 has velocity y = -2e\+40/);
  });

  it('when every value is large but finite as a 32-bit float, then inspection accepts it', async () => {
    const data = withLines((lines) => {
      const parts = lines[2]!.trim().split(/\s+/);
      parts[1] = '3e38';
      lines[2] = parts.join(' ');
    });
    const result = await inspectTrajectory(chunked(data), 'big.xyz', {});
    expect(result.frames).toBe(3);
  });
});
