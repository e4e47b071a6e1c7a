;; The per-frame loops of the fast FFT engine (fastFft.ts), in WebAssembly with 128-bit SIMD,
;; working in the memory of the PFFFT module (imported), so that a frame goes from the samples
;; through the window, the transform and the power sums without leaving that memory.
;; Source of frameKernelsWasm.ts (`npm run kernels` assembles it with wabt; a test checks that
;; the two agree). Pointers are byte offsets; float arrays are 16-byte aligned where loaded
;; as vectors (PFFFT's aligned allocations), sample arrays need only 4-byte alignment.
(module
  (import "env" "memory" (memory 1))

  ;; dst[i] = src[i] · win[i] for i < count floats (count a multiple of 4): a frame of interleaved
  ;; I, Q times a window stored with each coefficient twice (w0, w0, w1, w1, …).
  (func (export "window") (param $src i32) (param $win i32) (param $dst i32) (param $count i32)
    (local $end i32)
    (local.set $end (i32.add (local.get $dst) (i32.shl (local.get $count) (i32.const 2))))
    (block $done
      (loop $next
        (br_if $done (i32.ge_u (local.get $dst) (local.get $end)))
        (v128.store (local.get $dst)
          (f32x4.mul (v128.load align=4 (local.get $src)) (v128.load (local.get $win))))
        (local.set $src (i32.add (local.get $src) (i32.const 16)))
        (local.set $win (i32.add (local.get $win) (i32.const 16)))
        (local.set $dst (i32.add (local.get $dst) (i32.const 16)))
        (br $next))))

  ;; For the spectrum at $spec in PFFFT's z-domain layout (blocks of 8 floats: 4 real parts,
  ;; then their 4 imaginary parts), slots j = 0 … count−1 (count a multiple of 4):
  ;; p = re² + im² (float32), sum[j] += p and, when $max ≠ 0, max[j] = max(max[j], p), in
  ;; float64 arrays at $sum and $max.
  (func (export "power") (param $spec i32) (param $sum i32) (param $max i32) (param $count i32)
    (local $end i32) (local $re v128) (local $im v128) (local $p v128) (local $lo v128) (local $hi v128)
    (local.set $end (i32.add (local.get $sum) (i32.shl (local.get $count) (i32.const 3))))
    (block $done
      (loop $next
        (br_if $done (i32.ge_u (local.get $sum) (local.get $end)))
        (local.set $re (v128.load (local.get $spec)))
        (local.set $im (v128.load offset=16 (local.get $spec)))
        (local.set $p (f32x4.add (f32x4.mul (local.get $re) (local.get $re)) (f32x4.mul (local.get $im) (local.get $im))))
        (local.set $lo (f64x2.promote_low_f32x4 (local.get $p)))
        (local.set $hi (f64x2.promote_low_f32x4
          (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $p) (local.get $p))))
        (v128.store align=8 (local.get $sum) (f64x2.add (v128.load align=8 (local.get $sum)) (local.get $lo)))
        (v128.store offset=16 align=8 (local.get $sum) (f64x2.add (v128.load offset=16 align=8 (local.get $sum)) (local.get $hi)))
        (if (local.get $max)
          (then
            (v128.store align=8 (local.get $max) (f64x2.pmax (v128.load align=8 (local.get $max)) (local.get $lo)))
            (v128.store offset=16 align=8 (local.get $max) (f64x2.pmax (v128.load offset=16 align=8 (local.get $max)) (local.get $hi)))
            (local.set $max (i32.add (local.get $max) (i32.const 32)))))
        (local.set $spec (i32.add (local.get $spec) (i32.const 32)))
        (local.set $sum (i32.add (local.get $sum) (i32.const 32)))
        (br $next))))

  ;; Moments of $count interleaved complex samples at $src (float32), into 5 float64 at $out:
  ;; mean I, mean Q, Σ(I − μI)², Σ(Q − μQ)², Σ(I − μI)(Q − μQ), in two passes (the mean first),
  ;; each sample's (I, Q) one float64x2 lane pair.
  (func (export "moments") (param $src i32) (param $count i32) (param $out i32)
    (local $p i32) (local $end i32) (local $s v128) (local $m v128) (local $d v128) (local $sq v128) (local $cross v128)
    (local.set $end (i32.add (local.get $src) (i32.shl (local.get $count) (i32.const 3))))
    (local.set $s (f64x2.splat (f64.const 0)))
    (local.set $p (local.get $src))
    (block $done
      (loop $next
        (br_if $done (i32.ge_u (local.get $p) (local.get $end)))
        (local.set $s (f64x2.add (local.get $s) (f64x2.promote_low_f32x4 (v128.load64_zero align=4 (local.get $p)))))
        (local.set $p (i32.add (local.get $p) (i32.const 8)))
        (br $next)))
    (local.set $m (f64x2.div (local.get $s) (f64x2.splat (f64.convert_i32_u (local.get $count)))))
    (local.set $sq (f64x2.splat (f64.const 0)))
    (local.set $cross (f64x2.splat (f64.const 0)))
    (local.set $p (local.get $src))
    (block $done2
      (loop $next2
        (br_if $done2 (i32.ge_u (local.get $p) (local.get $end)))
        (local.set $d (f64x2.sub (f64x2.promote_low_f32x4 (v128.load64_zero align=4 (local.get $p))) (local.get $m)))
        (local.set $sq (f64x2.add (local.get $sq) (f64x2.mul (local.get $d) (local.get $d))))
        (local.set $cross (f64x2.add (local.get $cross) (f64x2.mul (local.get $d)
          (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $d) (local.get $d)))))
        (local.set $p (i32.add (local.get $p) (i32.const 8)))
        (br $next2)))
    (v128.store align=8 (local.get $out) (local.get $m))
    (v128.store offset=16 align=8 (local.get $out) (local.get $sq))
    (f64.store offset=32 (local.get $out) (f64x2.extract_lane 0 (local.get $cross))))
)
