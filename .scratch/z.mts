import { Zip, ZipDeflate, ZipPassThrough, zipSync, strToU8 } from 'fflate';
import { unzipSingle, gunzip } from '/work/main/server/formats/decompress.ts';
import { resolveLimits } from '/work/main/server/formats/limits.ts';
import { gzipSync } from 'node:zlib';
const parts: Uint8Array[] = [];
const z = new Zip((err, data, final) => { parts.push(data); });
const f = new ZipDeflate('traj.xyz', { level: 6 }); z.add(f); f.push(strToU8('3\nhello\nH 0 0 0\n'.repeat(1000)), true);
const d = new ZipPassThrough('dir/'); z.add(d); d.push(new Uint8Array(0), true);
z.end();
const buf = Buffer.concat(parts);
async function* one(b: Uint8Array) { for (let i = 0; i < b.length; i += 7) yield Buffer.from(b.subarray(i, i + 7)); }
let total = 0; const e: {name?: string} = {};
for await (const c of unzipSingle(one(buf), resolveLimits(), 'x.zip', e)) total += c.length;
console.log('streamed zip', total, e);
const two = zipSync({ 'a.xyz': strToU8('x'), 'b.xyz': strToU8('y') });
try { for await (const c of unzipSingle(one(two), resolveLimits(), 'x.zip')) {} } catch (err) { console.log(String(err)); }
const bomb = zipSync({ 'a.xyz': new Uint8Array(50e6) }, { level: 9 });
console.log('bomb size', bomb.length);
try { for await (const c of unzipSingle(one(bomb), resolveLimits({ maxCompressionRatio: 100 }), 'x.zip')) {} } catch (err) { console.log(String(err)); }
const gz = gzipSync(Buffer.alloc(50e6));
try { for await (const c of gunzip(one(gz), resolveLimits({ maxCompressionRatio: 100 }), 'x.gz')) {} } catch (err) { console.log(String(err)); }
try { for await (const c of gunzip(one(gz.subarray(0, 1000)), resolveLimits(), 'x.gz')) {} } catch (err) { console.log(String(err)); }
const bad = zipSync({ '../evil.xyz': strToU8('x') });
try { for await (const c of unzipSingle(one(bad), resolveLimits(), 'x.zip')) {} } catch (err) { console.log(String(err)); }
try { for await (const c of unzipSingle(one(buf.subarray(0, 60)), resolveLimits(), 'x.zip')) {} } catch (err) { console.log(String(err)); }
