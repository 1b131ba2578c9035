#!/usr/bin/env python3
"""Writes handmade_be_int16.nii.gz: a NIfTI-1 file built byte by byte from the field layout of
nifti1.h (R. W. Cox, NIH DFWG 2003/2007) with Python's struct module only (Python 3, standard
library; no NIfTI library involved), so the project's reader can be checked against the standard
rather than against its own writer.

Contents: big-endian, dim = [4, 3, 2, 2, 2], datatype 4 (int16), bitpix 16, pixdim = [1, 1.5, 2,
3, 1, ...], vox_offset 352, scl_slope 0.5, scl_inter 10, xyzt_units 10 (mm, s), qform_code 1,
sform_code 0, magic "n+1\\0". Stored value at linear index i (x fastest, then y, z, t) is
s_i = 7*i - 40, so the scaled value is 0.5*s_i + 10. The file is gzip-compressed (RFC 1952).
Run: python3 make_handmade.py   (writes the file next to this script)
"""
import gzip
import os
import struct

nx, ny, nz, nt = 3, 2, 2, 2
hdr = bytearray(348)
E = '>'  # big-endian
struct.pack_into(E + 'i', hdr, 0, 348)                       # sizeof_hdr
struct.pack_into(E + '8h', hdr, 40, 4, nx, ny, nz, nt, 1, 1, 1)  # dim
struct.pack_into(E + 'h', hdr, 70, 4)                         # datatype int16
struct.pack_into(E + 'h', hdr, 72, 16)                        # bitpix
struct.pack_into(E + '8f', hdr, 76, 1, 1.5, 2, 3, 1, 1, 1, 1)  # pixdim (qfac 1)
struct.pack_into(E + 'f', hdr, 108, 352.0)                    # vox_offset
struct.pack_into(E + 'f', hdr, 112, 0.5)                      # scl_slope
struct.pack_into(E + 'f', hdr, 116, 10.0)                     # scl_inter
hdr[123] = 2 | 8                                              # xyzt_units: mm, s
hdr[148:148 + 9] = b'handmade\0'                              # descrip
struct.pack_into(E + 'h', hdr, 252, 1)                        # qform_code
struct.pack_into(E + 'h', hdr, 254, 0)                        # sform_code
hdr[344:348] = b'n+1\0'                                       # magic
data = b''.join(struct.pack(E + 'h', 7 * i - 40) for i in range(nx * ny * nz * nt))
raw = bytes(hdr) + b'\0\0\0\0' + data                         # extender: no extensions
out = os.path.join(os.path.dirname(os.path.abspath(__file__)), 'handmade_be_int16.nii.gz')
with gzip.GzipFile(out, 'wb', mtime=0) as f:
    f.write(raw)
