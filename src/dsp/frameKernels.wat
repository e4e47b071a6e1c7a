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

;; Moments of $count interleaved complex samples at $src (float32), in one pass on the data
  ;; shifted by its first sample K (the "shifted data" algorithm: Chan, Golub & LeVeque 1983,
  ;; "Algorithms for computing the sample variance: analysis and recommendations", Am. Stat.
  ;; 37(3)): with d = x − K, into 7 float64 at $out: K_I, K_Q, Σd_I, Σd_Q, Σd_I², Σd_Q², Σd_I·d_Q
  ;; (the caller forms the mean and the centred sums). Each sample's (I, Q) is one float64x2,
  ;; two samples a step.
  (func (export "moments") (param $src i32) (param $count i32) (param $out i32)
    (local $p i32) (local $end i32) (local $k v128) (local $v v128) (local $a v128) (local $b v128)
    (local $s v128) (local $sq v128) (local $cross v128)
    (local.set $k (f64x2.promote_low_f32x4 (v128.load64_zero align=4 (local.get $src))))
    (local.set $s (f64x2.splat (f64.const 0)))
    (local.set $sq (f64x2.splat (f64.const 0)))
    (local.set $cross (f64x2.splat (f64.const 0)))
    (local.set $p (local.get $src))
    (local.set $end (i32.add (local.get $src) (i32.shl (i32.and (local.get $count) (i32.const -2)) (i32.const 3))))
    (block $done
      (loop $next
        (br_if $done (i32.ge_u (local.get $p) (local.get $end)))
        (local.set $v (v128.load align=4 (local.get $p)))
        (local.set $a (f64x2.sub (f64x2.promote_low_f32x4 (local.get $v)) (local.get $k)))
        (local.set $b (f64x2.sub (f64x2.promote_low_f32x4
          (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $v) (local.get $v))) (local.get $k)))
        (local.set $s (f64x2.add (local.get $s) (f64x2.add (local.get $a) (local.get $b))))
        (local.set $sq (f64x2.add (local.get $sq)
          (f64x2.add (f64x2.mul (local.get $a) (local.get $a)) (f64x2.mul (local.get $b) (local.get $b)))))
        (local.set $cross (f64x2.add (local.get $cross) (f64x2.add
          (f64x2.mul (local.get $a) (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $a) (local.get $a)))
          (f64x2.mul (local.get $b) (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $b) (local.get $b))))))
        (local.set $p (i32.add (local.get $p) (i32.const 16)))
        (br $next)))
    (if (i32.and (local.get $count) (i32.const 1))
      (then
        (local.set $a (f64x2.sub (f64x2.promote_low_f32x4 (v128.load64_zero align=4 (local.get $p))) (local.get $k)))
        (local.set $s (f64x2.add (local.get $s) (local.get $a)))
        (local.set $sq (f64x2.add (local.get $sq) (f64x2.mul (local.get $a) (local.get $a))))
        (local.set $cross (f64x2.add (local.get $cross)
          (f64x2.mul (local.get $a) (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $a) (local.get $a)))))))
    (v128.store align=8 (local.get $out) (local.get $k))
    (v128.store offset=16 align=8 (local.get $out) (local.get $s))
    (v128.store offset=32 align=8 (local.get $out) (local.get $sq))
    (f64.store offset=48 (local.get $out) (f64x2.extract_lane 0 (local.get $cross))))

  ;; Scrub of $frames complex float32 samples at $p, in place: a sample with a NaN or infinite
  ;; component becomes 0 + 0j and is counted; components with |x| ≥ 1 are counted as clipped.
  ;; The two counts go to $out as two i32 (non-finite samples, clipped components). Two samples
  ;; a vector: when all four |x| < 1 (false for NaN) nothing else is looked at.
  (global $nonFinite (mut i32) (i32.const 0))
  (global $clipped (mut i32) (i32.const 0))
  (func $scrubOne (param $p i32)
    (local $i f32) (local $q f32)
    (local.set $i (f32.load (local.get $p)))
    (local.set $q (f32.load offset=4 (local.get $p)))
    ;; x − x is NaN exactly when x is NaN or infinite, and NaN ≠ NaN.
    (if (i32.or
          (f32.ne (f32.sub (local.get $i) (local.get $i)) (f32.sub (local.get $i) (local.get $i)))
          (f32.ne (f32.sub (local.get $q) (local.get $q)) (f32.sub (local.get $q) (local.get $q))))
      (then
        (f32.store (local.get $p) (f32.const 0))
        (f32.store offset=4 (local.get $p) (f32.const 0))
        (global.set $nonFinite (i32.add (global.get $nonFinite) (i32.const 1))))
      (else
        (global.set $clipped (i32.add (global.get $clipped)
          (i32.add (f32.ge (f32.abs (local.get $i)) (f32.const 1)) (f32.ge (f32.abs (local.get $q)) (f32.const 1))))))))
  (func (export "scrub") (param $p i32) (param $frames i32) (param $out i32)
    (local $end i32)
    (global.set $nonFinite (i32.const 0))
    (global.set $clipped (i32.const 0))
    (local.set $end (i32.add (local.get $p) (i32.shl (local.get $frames) (i32.const 3))))
    (block $done
      (loop $next
        (br_if $done (i32.gt_u (i32.add (local.get $p) (i32.const 16)) (local.get $end)))
        (if (i32.eqz (i32x4.all_true (f32x4.lt (f32x4.abs (v128.load align=4 (local.get $p))) (f32x4.splat (f32.const 1)))))
          (then
            (call $scrubOne (local.get $p))
            (call $scrubOne (i32.add (local.get $p) (i32.const 8)))))
        (local.set $p (i32.add (local.get $p) (i32.const 16)))
        (br $next)))
    (if (i32.lt_u (local.get $p) (local.get $end)) (then (call $scrubOne (local.get $p))))
    (i32.store (local.get $out) (global.get $nonFinite))
    (i32.store offset=4 (local.get $out) (global.get $clipped)))

  ;; As "power", with float32 sums and maxima at $sum and $max (the spectrogram's rows).
  (func (export "power32") (param $spec i32) (param $sum i32) (param $max i32) (param $count i32)
    (local $end i32) (local $re v128) (local $im v128) (local $p v128)
    (local.set $end (i32.add (local.get $sum) (i32.shl (local.get $count) (i32.const 2))))
    (block $done
      (loop $next
        (br_if $done (i32.ge_u (local.get $sum) (local.get $end)))
        (local.set $re (v128.load (local.get $spec)))
        (local.set $im (v128.load offset=16 (local.get $spec)))
        (local.set $p (f32x4.add (f32x4.mul (local.get $re) (local.get $re)) (f32x4.mul (local.get $im) (local.get $im))))
        (v128.store (local.get $sum) (f32x4.add (v128.load (local.get $sum)) (local.get $p)))
        (if (local.get $max)
          (then
            (v128.store (local.get $max) (f32x4.pmax (v128.load (local.get $max)) (local.get $p)))
            (local.set $max (i32.add (local.get $max) (i32.const 16)))))
        (local.set $spec (i32.add (local.get $spec) (i32.const 32)))
        (local.set $sum (i32.add (local.get $sum) (i32.const 16)))
        (br $next))))

  ;; The channel extractor's loops (nco.ts, polyphaseDecimator.ts), in float64x2 with each complex
  ;; sample's (I, Q) one vector: the same operations in the same order as the JavaScript loops,
  ;; so the outputs are theirs to the bit. This instance works in a memory of its own (chainKernels.ts).

  ;; The mixer in place over $count interleaved float32 samples at $y: with P = c·T + s·T′ from
  ;; the table at $t (32 bytes an index: T = (cos, sin), T′ = (−sin, cos), float64), the sample
  ;; (xr, xi) becomes (xr·Pr − xi·Pi, xr·Pi + xi·Pr), rounded to float32.
  (func (export "mix") (param $y i32) (param $count i32) (param $t i32) (param $c f64) (param $s f64)
    (local $end i32) (local $cv v128) (local $sv v128) (local $p v128) (local $x v128) (local $o v128)
    (local.set $cv (f64x2.splat (local.get $c)))
    (local.set $sv (f64x2.splat (local.get $s)))
    (local.set $end (i32.add (local.get $y) (i32.shl (local.get $count) (i32.const 3))))
    (block $done
      (loop $next
        (br_if $done (i32.ge_u (local.get $y) (local.get $end)))
        (local.set $p (f64x2.add
          (f64x2.mul (local.get $cv) (v128.load align=8 (local.get $t)))
          (f64x2.mul (local.get $sv) (v128.load offset=16 align=8 (local.get $t)))))
        (local.set $x (f64x2.promote_low_f32x4 (v128.load64_zero align=4 (local.get $y))))
        (local.set $o (f64x2.add
          (f64x2.mul (f64x2.splat (f64x2.extract_lane 0 (local.get $x))) (local.get $p))
          (f64x2.mul (f64x2.splat (f64x2.extract_lane 1 (local.get $x)))
            (f64x2.mul (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $p) (local.get $p))
              (v128.const f64x2 -1 1)))))
        (v128.store64_lane align=4 0 (local.get $y) (f32x4.demote_f64x2_zero (local.get $o)))
        (local.set $y (i32.add (local.get $y) (i32.const 8)))
        (local.set $t (i32.add (local.get $t) (i32.const 32)))
        (br $next))))

  ;; The decimator's dot products for symmetric taps: output j (j < $count) is
  ;; Σ_k h[k]·(x[a + k] + x[a + L − 1 − k]) over the pairs, a = $first + j·$D, with two
  ;; accumulators (pairs k even and odd) added at the end, then the middle tap of an odd L:
  ;; complex float32 samples at $buf, float64 taps at $h, float32 outputs at $out.
  (func (export "symdots") (param $buf i32) (param $first i32) (param $D i32) (param $count i32)
      (param $h i32) (param $L i32) (param $out i32)
    (local $j i32) (local $a i32) (local $b i32) (local $k i32) (local $pairs i32) (local $t i32)
    (local $acc0 v128) (local $acc1 v128)
    (local.set $pairs (i32.shr_u (local.get $L) (i32.const 1)))
    (block $outputs
      (loop $output
        (br_if $outputs (i32.ge_u (local.get $j) (local.get $count)))
        (local.set $a (i32.add (local.get $buf)
          (i32.shl (i32.add (local.get $first) (i32.mul (local.get $j) (local.get $D))) (i32.const 3))))
        (local.set $b (i32.add (local.get $a) (i32.shl (i32.sub (local.get $L) (i32.const 1)) (i32.const 3))))
        (local.set $acc0 (v128.const f64x2 0 0))
        (local.set $acc1 (v128.const f64x2 0 0))
        (local.set $k (i32.const 0))
        (local.set $t (local.get $h))
        (block $pairsDone
          (loop $pair
            (br_if $pairsDone (i32.ge_u (i32.add (local.get $k) (i32.const 1)) (local.get $pairs)))
            (local.set $acc0 (f64x2.add (local.get $acc0)
              (f64x2.mul (v128.load64_splat align=8 (local.get $t))
                (f64x2.add (f64x2.promote_low_f32x4 (v128.load64_zero align=4 (local.get $a))) (f64x2.promote_low_f32x4 (v128.load64_zero align=4 (local.get $b)))))))
            (local.set $acc1 (f64x2.add (local.get $acc1)
              (f64x2.mul (v128.load64_splat offset=8 align=8 (local.get $t))
                (f64x2.add (f64x2.promote_low_f32x4 (v128.load64_zero offset=8 align=4 (local.get $a)))
                  (f64x2.promote_low_f32x4 (v128.load64_zero align=4 (i32.sub (local.get $b) (i32.const 8))))))))
            (local.set $k (i32.add (local.get $k) (i32.const 2)))
            (local.set $t (i32.add (local.get $t) (i32.const 16)))
            (local.set $a (i32.add (local.get $a) (i32.const 16)))
            (local.set $b (i32.sub (local.get $b) (i32.const 16)))
            (br $pair)))
        (if (i32.lt_u (local.get $k) (local.get $pairs))
          (then
            (local.set $acc0 (f64x2.add (local.get $acc0)
              (f64x2.mul (v128.load64_splat align=8 (local.get $t))
                (f64x2.add (f64x2.promote_low_f32x4 (v128.load64_zero align=4 (local.get $a))) (f64x2.promote_low_f32x4 (v128.load64_zero align=4 (local.get $b)))))))
            (local.set $t (i32.add (local.get $t) (i32.const 8)))
            (local.set $a (i32.add (local.get $a) (i32.const 8)))))
        (local.set $acc0 (f64x2.add (local.get $acc0) (local.get $acc1)))
        (if (i32.and (local.get $L) (i32.const 1))
          (then
            (local.set $acc0 (f64x2.add (local.get $acc0)
              (f64x2.mul (v128.load64_splat align=8 (i32.add (local.get $h) (i32.shl (local.get $pairs) (i32.const 3))))
                (f64x2.promote_low_f32x4 (v128.load64_zero align=4 (local.get $a))))))))
        (v128.store64_lane align=4 0
          (i32.add (local.get $out) (i32.shl (local.get $j) (i32.const 3)))
          (f32x4.demote_f64x2_zero (local.get $acc0)))
        (local.set $j (i32.add (local.get $j) (i32.const 1)))
        (br $output))))
)
