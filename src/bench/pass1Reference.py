#!/usr/bin/env python3
"""Pass 1 of iqaudit written as a plain numpy/scipy script: the yardstick of `npm run bench`.

Usage: python3 src/bench/pass1Reference.py FILE [--figures OUT.json --rate HZ]
       [--block-samples N] [--batch-frames N]

FILE is a cf32_le capture (interleaved float32 I,Q, no header), read whole. The script does the
work of src/analysis/pass1.ts over it and prints one JSON line
{"seconds", "maxRssMiB", "samples", "sha256"}:

- SHA-256 of every byte of the file (hashlib).
- Samples with a NaN or infinite component are counted and set to 0 + 0j; components with
  |x| >= 1 in the other samples are counted as clipped (src/capture/sampleFormat.ts, scrubFloat).
- Welch: segments of N = 4096 at hop 2048 (50 % overlap), periodic Hann window
  (0.5 - 0.5 cos(2 pi n / N), scipy.signal.get_window("hann", N), the DFT-even form of
  src/dsp/windows.ts), per bin the sum and the maximum of |X|^2 over the segments; a trailing
  partial segment is dropped.
- Spectrogram: F = floor(samples / 1024) frames of 1024 without overlap, the same window; frame k
  goes to row floor(k * R / F), R = min(1000, F) (PASS1_DEFAULTS.spectrogramRows); per row and
  bin the sum and the maximum of |X|^2, and the frames per row.
- Health: means of I and Q, centred sums of (I - mean)^2, (Q - mean)^2 and their cross product,
  per block in float64 and combined by the pairwise update of Chan, Golub & LeVeque (1979).

How it is written: the file is read in blocks of --block-samples (default 4 Mi samples, 32 MiB)
into one preallocated buffer; the samples after the last whole Welch segment (fewer than 4096)
are carried to the front of the buffer for the next block, so every segment and frame that
crosses a block edge is computed once, exactly. Segments are strided views
(numpy.lib.stride_tricks.sliding_window_view), windowed and transformed in batches of
--batch-frames (default 256) by scipy.fft.fft(frames, axis=-1) with the default single worker;
everything stays complex64/float32 except the sums across batches (float64). Memory is bounded
by the block and one batch, whatever the file size. One thread throughout: no FFT workers, and
the hash runs in the same thread as the transforms.

With --figures OUT.json (and --rate HZ, the sample rate, default 1) the script also writes the
results, scaled as iqaudit reports them (density |X|^2 / (fs * sum w^2), FS^2/Hz, centred bin
order): welch {segmentCount, densityPerHz, maxHoldPerHz}, spectrogram {rowCount, framesPerRow,
meanPerHz, maxPerHz} (row-major), health {samples, meanI, meanQ, sumSqI, sumSqQ, sumIQ,
clippedComponents, nonFiniteSamples}.

Checked once against iqaudit's pass 1 (runPass1, 2 workers) on the first 64 MiB of
bench_1024MiB_2.4Msps.cf32 (8 Mi samples: 4095 segments, 1000 rows of 8 or 9 frames): the sha256
equal (and equal to hashlib over the whole file read at once); segment count and frames per row
equal; Welch mean PSD and max hold within 2e-7 of the spectrum's peak (median bin 1e-6
relative); spectrogram rows 0, 1, 499 and 999, and in fact every row, mean and max within 5e-7
of the row's peak (median bin 1.3e-6 relative): float32 transforms against iqaudit's float64
ones. DC offset, mean power, IQ gain and phase imbalance computed from these moments agree with
iqaudit's to 1e-9 relative. scipy.signal.welch(x, fs, window="hann", nperseg=4096,
noverlap=2048, detrend=False, return_onesided=False, scaling="density") on the same samples agrees
with this script's mean PSD to 2e-6 relative (complex64 input) and with iqaudit's to 4e-15
(complex128). test/bench/pass1Reference.test.ts repeats the Welch, spectrogram and count
comparison on a small generated file read in small blocks, and the scipy.signal.welch one.
"""
import argparse
import hashlib
import json
import os
import resource
import sys
import time

import numpy as np
import scipy.fft
from numpy.lib.stride_tricks import sliding_window_view

WELCH_LENGTH = 4096
WELCH_HOP = 2048
FRAME_LENGTH = 1024
ROWS_WANTED = 1000
SAMPLE_BYTES = 8  # cf32_le: two float32 components
MOMENT_CHUNK = 1 << 20  # samples a float64 copy is made of at a time, to bound memory


class Moments:
    """Count, means and centred sums of I and Q, combined pairwise (Chan, Golub & LeVeque 1979)."""

    def __init__(self):
        self.n = 0
        self.mean_i = self.mean_q = 0.0
        self.s_ii = self.s_qq = self.s_iq = 0.0

    def add(self, iq):
        """Adds the samples of `iq`, an (n, 2) float32 view of I,Q pairs."""
        for start in range(0, iq.shape[0], MOMENT_CHUNK):
            self.add_chunk(iq[start:start + MOMENT_CHUNK])

    def add_chunk(self, iq):
        n = iq.shape[0]
        i = iq[:, 0].astype(np.float64)
        q = iq[:, 1].astype(np.float64)
        mi, mq = i.mean(), q.mean()
        i -= mi
        q -= mq
        self.combine(n, mi, mq, float(i @ i), float(q @ q), float(i @ q))

    def combine(self, n, mi, mq, s_ii, s_qq, s_iq):
        total = self.n + n
        di, dq = mi - self.mean_i, mq - self.mean_q
        w = self.n * n / total
        self.mean_i += di * n / total
        self.mean_q += dq * n / total
        self.s_ii += s_ii + di * di * w
        self.s_qq += s_qq + dq * dq * w
        self.s_iq += s_iq + di * dq * w
        self.n = total


class Pass1:
    """The accumulators; `block` takes consecutive samples, `finish` the trailing ones."""

    def __init__(self, total_samples, batch_frames):
        self.window = periodic_hann(WELCH_LENGTH)
        self.frame_window = periodic_hann(FRAME_LENGTH)
        self.batch = batch_frames
        self.welch_sum = np.zeros(WELCH_LENGTH)
        self.welch_max = np.zeros(WELCH_LENGTH, np.float32)
        self.segments = 0
        self.frame_count = total_samples // FRAME_LENGTH
        self.rows = min(ROWS_WANTED, self.frame_count)
        self.row_sum = np.zeros((self.rows, FRAME_LENGTH))
        self.row_max = np.zeros((self.rows, FRAME_LENGTH), np.float32)
        self.frames_per_row = np.zeros(self.rows, np.int64)
        self.next_frame = 0
        self.moments = Moments()
        self.clipped = 0
        self.non_finite = 0

    def scrub(self, z):
        """Counts and zeroes non-finite samples of complex64 `z` in place; counts clipped components."""
        v = z.view(np.float32).reshape(-1, 2)
        lo, hi = v.min(initial=0.0), v.max(initial=0.0)
        if lo > -1 and hi < 1:  # the usual case; a NaN fails both tests
            return v
        bad = ~np.isfinite(v).all(axis=1)
        self.non_finite += int(np.count_nonzero(bad))
        v[bad] = 0
        self.clipped += int(np.count_nonzero(np.abs(v) >= 1))
        return v

    def welch(self, z):
        """Adds the whole segments of `z` (which starts on a segment boundary); returns their count."""
        if z.shape[0] < WELCH_LENGTH:
            return 0
        segments = sliding_window_view(z, WELCH_LENGTH)[::WELCH_HOP]
        for start in range(0, segments.shape[0], self.batch):
            p = power(segments[start:start + self.batch], self.window)
            self.welch_sum += p.sum(axis=0)
            np.maximum(self.welch_max, p.max(axis=0), out=self.welch_max)
        self.segments += segments.shape[0]
        return segments.shape[0]

    def frames(self, z):
        """Adds the len(z) // 1024 frames of `z` (which starts on a frame boundary) to their rows."""
        count = min(z.shape[0] // FRAME_LENGTH, self.frame_count - self.next_frame)
        frames = z[:count * FRAME_LENGTH].reshape(count, FRAME_LENGTH)
        for start in range(0, count, self.batch):
            p = power(frames[start:start + self.batch], self.frame_window)
            k = self.next_frame + start + np.arange(p.shape[0])
            row = k * self.rows // self.frame_count
            first = np.flatnonzero(np.r_[True, row[1:] != row[:-1]])
            r = row[first]
            self.row_sum[r] += np.add.reduceat(p, first, axis=0)
            self.row_max[r] = np.maximum(self.row_max[r], np.maximum.reduceat(p, first, axis=0))
            self.frames_per_row[r] += np.diff(np.r_[first, p.shape[0]])
        self.next_frame += count

    def block(self, z, new):
        """`z` holds the carried samples then `new` fresh ones; returns how many samples to carry on."""
        v = self.scrub(z[z.shape[0] - new:])
        self.moments.add(v)
        m = self.welch(z)
        self.frames(z[:m * WELCH_HOP])
        return z.shape[0] - m * WELCH_HOP

    def finish(self, z):
        self.frames(z)


def periodic_hann(n):
    """0.5 - 0.5 cos(2 pi k / n), k = 0..n-1 (Harris 1978 eq. 27a), float32.

    The same as scipy.signal.get_window("hann", n); written out because importing scipy.signal
    costs some 50 MiB of RSS, which would be charged to the script's peak.
    """
    return (0.5 - 0.5 * np.cos(2 * np.pi * np.arange(n) / n)).astype(np.float32)


def power(frames, window):
    """|FFT(window * frame)|^2 of each row of `frames` (complex64), float32."""
    x = scipy.fft.fft(frames * window, axis=-1, overwrite_x=True)
    p = np.abs(x)
    return np.multiply(p, p, out=p)


def read_into(f, view):
    """Fills `view` from `f` until it is full or the file ends; returns the bytes read."""
    done = 0
    while done < len(view):
        n = f.readinto(view[done:])
        if not n:
            break
        done += n
    return done


def sweep(path, block_samples, batch_frames):
    size = os.path.getsize(path)
    if size % SAMPLE_BYTES != 0:
        fail(f"{path}: {size} bytes is not a whole number of cf32_le samples (8 bytes each)")
    acc = Pass1(size // SAMPLE_BYTES, batch_frames)
    digest = hashlib.sha256()
    buffer = np.empty(WELCH_LENGTH + block_samples, np.complex64)
    raw = memoryview(buffer.view(np.uint8))
    carry = 0
    with open(path, "rb", buffering=0) as f:
        while True:
            got = read_into(f, raw[carry * SAMPLE_BYTES:(carry + block_samples) * SAMPLE_BYTES])
            if got == 0:
                break
            digest.update(raw[carry * SAMPLE_BYTES:carry * SAMPLE_BYTES + got])
            new = got // SAMPLE_BYTES
            kept = acc.block(buffer[:carry + new], new)
            buffer[:kept] = buffer[carry + new - kept:carry + new]
            carry = kept
    acc.finish(buffer[:carry])
    return acc, digest.hexdigest()


def figures(acc, rate_hz):
    """The results scaled and ordered as iqaudit reports them (module docstring)."""
    welch_scale = 1 / (rate_hz * float(np.sum(acc.window.astype(np.float64) ** 2)))
    frame_scale = 1 / (rate_hz * float(np.sum(acc.frame_window.astype(np.float64) ** 2)))
    per_row = np.maximum(acc.frames_per_row, 1)[:, None]
    m = acc.moments
    return {
        "welch": {
            "segmentCount": acc.segments,
            "densityPerHz": np.fft.fftshift(acc.welch_sum * welch_scale / max(acc.segments, 1)).tolist(),
            "maxHoldPerHz": np.fft.fftshift(acc.welch_max * welch_scale).tolist(),
        },
        "spectrogram": {
            "rowCount": acc.rows,
            "framesPerRow": acc.frames_per_row.tolist(),
            "meanPerHz": np.fft.fftshift(acc.row_sum * frame_scale / per_row, axes=1).ravel().tolist(),
            "maxPerHz": np.fft.fftshift(acc.row_max * frame_scale, axes=1).ravel().tolist(),
        },
        "health": {
            "samples": m.n, "meanI": m.mean_i, "meanQ": m.mean_q, "sumSqI": m.s_ii, "sumSqQ": m.s_qq,
            "sumIQ": m.s_iq, "clippedComponents": acc.clipped, "nonFiniteSamples": acc.non_finite,
        },
    }


def fail(message):
    sys.stderr.write(f"pass1Reference: {message}\n")
    sys.exit(2)


def main():
    parser = argparse.ArgumentParser(description="iqaudit pass 1 in numpy/scipy (one thread)")
    parser.add_argument("file")
    parser.add_argument("--figures", help="write the results to this JSON file")
    parser.add_argument("--rate", type=float, default=1.0, help="sample rate, Hz, for --figures")
    parser.add_argument("--block-samples", type=int, default=4 << 20)
    parser.add_argument("--batch-frames", type=int, default=256)
    args = parser.parse_args()
    if args.block_samples < WELCH_LENGTH:
        fail(f"--block-samples {args.block_samples} must be at least {WELCH_LENGTH}")
    if args.batch_frames < 1:
        fail(f"--batch-frames {args.batch_frames} must be at least 1")
    if not os.path.isfile(args.file):
        fail(f"{args.file}: no such file")
    started = time.perf_counter()
    acc, sha256 = sweep(args.file, args.block_samples, args.batch_frames)
    seconds = time.perf_counter() - started
    if args.figures:
        with open(args.figures, "w") as out:
            json.dump(figures(acc, args.rate), out)
    rss_mib = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024
    print(json.dumps({"seconds": seconds, "maxRssMiB": rss_mib, "samples": acc.moments.n, "sha256": sha256}))


if __name__ == "__main__":
    main()
