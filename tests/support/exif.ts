// Just enough of an EXIF reader to tell whether a photo carries a position: the tag ids of
// IFD0 and of the GPS IFD it points to. Layout from the TIFF 6.0 specification (header, IFD
// entries of 12 bytes) and EXIF 2.3 §4.6.3 (tag 0x8825 = pointer to the GPS IFD).
export const GPS_IFD_POINTER = 0x8825;
export const GPS_LATITUDE = 0x0002;

/** `exif` as sharp's metadata() returns it: "Exif\0\0" then a TIFF stream. */
export function exifTags(exif: Buffer): { ifd0: number[]; gps: number[] } {
  const tiff = exif.subarray(exif.subarray(0, 6).toString('latin1') === 'Exif\0\0' ? 6 : 0);
  const little = tiff.subarray(0, 2).toString('latin1') === 'II';
  const u16 = (at: number) => (little ? tiff.readUInt16LE(at) : tiff.readUInt16BE(at));
  const u32 = (at: number) => (little ? tiff.readUInt32LE(at) : tiff.readUInt32BE(at));
  const readIfd = (offset: number) => {
    const count = u16(offset);
    return Array.from({ length: count }, (_, i) => {
      const entry = offset + 2 + i * 12;
      return { tag: u16(entry), value: u32(entry + 8) };
    });
  };
  const ifd0 = readIfd(u32(4));
  const pointer = ifd0.find((e) => e.tag === GPS_IFD_POINTER);
  return {
    ifd0: ifd0.map((e) => e.tag),
    gps: pointer ? readIfd(pointer.value).map((e) => e.tag) : [],
  };
}
