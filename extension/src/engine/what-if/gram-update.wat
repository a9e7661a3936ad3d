;; The what-if's dot-product update in WebAssembly: the pair loop of IncrementalGram.update
;; (incremental-gram.ts: stopping or restoring term t moves the kept dot product D_ij and the count
;; of shared kept terms of every pair of sampled rows that both hold t), the same IEEE double
;; operations in the same order, so every product is the same bits as the TypeScript's
;; (test/what-if-gram-update-wasm.test.ts compares them). Any change here is made there too, and
;; the other way round. scripts/build.mjs turns this text into the module the bundles carry
;; (incremental-gram.ts loads it).
;;
;; Arrays are byte offsets into the memory that holds the sample's states (SharedRowSweep's: the
;; dot products, m×m f64 row-major; the shared-term counts, m×m u16 or u32; the term's sample
;; postings, row positions u32 and weights f64, rows ascending per term).
(module
  (import "env" "memory" (memory 1 65536 shared))

  ;; For the postings a in [aFrom, aTo) of a term whose postings are [from, to), with sign ±1:
  ;; row i = pos[a] and wi = sign·val[a]; for every other posting b of the term, in order, the pair
  ;; (i, pos[b]) gets count += sign and D += wi·val[b], or exact +0 when the count reaches 0.
  ;; `wide`: the counts are u32, else u16 (stored modulo 2^16 as a Uint16Array stores).
  (func (export "update")
    (param $dots i32) (param $counts i32) (param $wide i32) (param $pos i32) (param $val i32) (param $m i32)
    (param $from i32) (param $to i32) (param $aFrom i32) (param $aTo i32) (param $sign i32)
    (local $a i32) (local $b i32) (local $row i32) (local $at i32) (local $count i32) (local $cAt i32) (local $dAt i32)
    (local $wi f64) (local $fsign f64)
    (local.set $fsign (f64.convert_i32_s (local.get $sign)))
    (local.set $a (local.get $aFrom))
    (block $done
      (loop $posting
        (br_if $done (i32.ge_u (local.get $a) (local.get $aTo)))
        (local.set $row (i32.mul (i32.load (i32.add (local.get $pos) (i32.shl (local.get $a) (i32.const 2)))) (local.get $m)))
        (local.set $wi (f64.mul (local.get $fsign) (f64.load (i32.add (local.get $val) (i32.shl (local.get $a) (i32.const 3))))))
        (local.set $b (local.get $from))
        (if (local.get $wide)
          (then
            (block $pairsDone
              (loop $pair
                (br_if $pairsDone (i32.ge_u (local.get $b) (local.get $to)))
                (if (i32.ne (local.get $b) (local.get $a))
                  (then
                    (local.set $at (i32.add (local.get $row) (i32.load (i32.add (local.get $pos) (i32.shl (local.get $b) (i32.const 2))))))
                    (local.set $cAt (i32.add (local.get $counts) (i32.shl (local.get $at) (i32.const 2))))
                    (local.set $count (i32.add (i32.load (local.get $cAt)) (local.get $sign)))
                    (i32.store (local.get $cAt) (local.get $count))
                    (local.set $dAt (i32.add (local.get $dots) (i32.shl (local.get $at) (i32.const 3))))
                    (f64.store (local.get $dAt)
                      (select
                        (f64.add (f64.load (local.get $dAt)) (f64.mul (local.get $wi) (f64.load (i32.add (local.get $val) (i32.shl (local.get $b) (i32.const 3))))))
                        (f64.const 0)
                        (local.get $count)))))
                (local.set $b (i32.add (local.get $b) (i32.const 1)))
                (br $pair))))
          (else
            (block $pairsDone
              (loop $pair
                (br_if $pairsDone (i32.ge_u (local.get $b) (local.get $to)))
                (if (i32.ne (local.get $b) (local.get $a))
                  (then
                    (local.set $at (i32.add (local.get $row) (i32.load (i32.add (local.get $pos) (i32.shl (local.get $b) (i32.const 2))))))
                    (local.set $cAt (i32.add (local.get $counts) (i32.shl (local.get $at) (i32.const 1))))
                    (local.set $count (i32.add (i32.load16_u (local.get $cAt)) (local.get $sign)))
                    (i32.store16 (local.get $cAt) (local.get $count))
                    (local.set $dAt (i32.add (local.get $dots) (i32.shl (local.get $at) (i32.const 3))))
                    (f64.store (local.get $dAt)
                      (select
                        (f64.add (f64.load (local.get $dAt)) (f64.mul (local.get $wi) (f64.load (i32.add (local.get $val) (i32.shl (local.get $b) (i32.const 3))))))
                        (f64.const 0)
                        (local.get $count)))))
                (local.set $b (i32.add (local.get $b) (i32.const 1)))
                (br $pair)))))
        (local.set $a (i32.add (local.get $a) (i32.const 1)))
        (br $posting))))
)
