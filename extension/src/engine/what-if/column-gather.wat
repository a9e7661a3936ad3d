;; The what-if's column gather in WebAssembly: gatherColumnChanges of shared-column-gather.ts (a
;; click on a term in most rows: each kept column's Σ w·Δinv and Σ w²·Δ(1/norm²) down its postings,
;; rows ascending), the same IEEE double operations in the same order, so every sum is the same
;; bits as the TypeScript's (test/what-if-column-gather-wasm.test.ts compares them). Any change
;; here is made there too, and the other way round. scripts/build.mjs turns this text into the
;; module the bundles carry (shared-column-gather.ts loads it).
;;
;; Arrays are byte offsets into the one memory the gathering threads share (each thread has its own
;; instance, so its own globals): start (u32, cols + 1), rowIds (u32, one per non-zero), values (f64,
;; the same order), rowChange (f64, two per row side by side), mask (u8, one per column), out (f64,
;; two per column side by side); and, given to each gather, the sums S1 and S2 (f64, one per column
;; each) when they live in the same memory.
(module
  (import "env" "memory" (memory 1 65536 shared))

  (global $start (mut i32) (i32.const 0))
  (global $rowIds (mut i32) (i32.const 0))
  (global $values (mut i32) (i32.const 0))
  (global $rowChange (mut i32) (i32.const 0))
  (global $mask (mut i32) (i32.const 0))
  (global $out (mut i32) (i32.const 0))

  (func (export "layout") (param $start i32) (param $rowIds i32) (param $values i32) (param $rowChange i32) (param $mask i32) (param $out i32)
    (global.set $start (local.get $start))
    (global.set $rowIds (local.get $rowIds))
    (global.set $values (local.get $values))
    (global.set $rowChange (local.get $rowChange))
    (global.set $mask (local.get $mask))
    (global.set $out (local.get $out)))

  ;; For the kept columns u ≠ t in [from, to): a = Σ w·rowChange[2r], b = Σ (w·w)·rowChange[2r + 1]
  ;; over the column's postings in order, each from +0, into out[2u] and out[2u + 1], or, with $s1
  ;; non-zero, added to the sums there: S1[u] = S1[u] + a and S2[u] = S2[u] + b (the owner's add
  ;; after the gather, made as each column ends, with no pass over out; the same two additions,
  ;; so the same bits). The arrays'
  ;; offsets are read into locals once and a column's postings walked by two pointers: V8 loads a
  ;; global from the instance at every global.get, also inside a loop, and three globals a posting
  ;; with each posting's addresses worked out from its index cost ~16% of the gather's CPU
  ;; (docs/performance.md, "What-if: globals out of the hot loops").
  (func (export "gather") (param $t i32) (param $from i32) (param $to i32) (param $s1 i32) (param $s2 i32)
    (local $u i32) (local $c i32) (local $id i32) (local $idEnd i32) (local $v i32)
    (local $a f64) (local $b f64) (local $w f64)
    (local $start i32) (local $rowIds i32) (local $values i32) (local $rowChange i32) (local $mask i32) (local $out i32)
    (local.set $start (global.get $start))
    (local.set $rowIds (global.get $rowIds))
    (local.set $values (global.get $values))
    (local.set $rowChange (global.get $rowChange))
    (local.set $mask (global.get $mask))
    (local.set $out (global.get $out))
    (local.set $u (local.get $from))
    (block $done
      (loop $column
        (br_if $done (i32.ge_u (local.get $u) (local.get $to)))
        (if (i32.and
              (i32.eqz (i32.load8_u (i32.add (local.get $mask) (local.get $u))))
              (i32.ne (local.get $u) (local.get $t)))
          (then
            (local.set $a (f64.const 0))
            (local.set $b (f64.const 0))
            ;; The column's postings: start[u] ≤ q < start[u + 1], at rowIds + 4q (id) and values + 8q (v).
            (local.set $c (i32.add (local.get $start) (i32.shl (local.get $u) (i32.const 2))))
            (local.set $idEnd (i32.add (local.get $rowIds) (i32.shl (i32.load offset=4 (local.get $c)) (i32.const 2))))
            (local.set $id (i32.add (local.get $rowIds) (i32.shl (i32.load (local.get $c)) (i32.const 2))))
            (local.set $v (i32.add (local.get $values) (i32.shl (i32.load (local.get $c)) (i32.const 3))))
            (block $column_done
              (loop $entry
                (br_if $column_done (i32.ge_u (local.get $id) (local.get $idEnd)))
                (local.set $c (i32.add (local.get $rowChange) (i32.shl (i32.load (local.get $id)) (i32.const 4))))
                (local.set $w (f64.load (local.get $v)))
                (local.set $a (f64.add (local.get $a) (f64.mul (local.get $w) (f64.load (local.get $c)))))
                (local.set $b (f64.add (local.get $b) (f64.mul (f64.mul (local.get $w) (local.get $w)) (f64.load offset=8 (local.get $c)))))
                (local.set $id (i32.add (local.get $id) (i32.const 4)))
                (local.set $v (i32.add (local.get $v) (i32.const 8)))
                (br $entry)))
            (if (local.get $s1)
              (then
                (local.set $c (i32.add (local.get $s1) (i32.shl (local.get $u) (i32.const 3))))
                (f64.store (local.get $c) (f64.add (f64.load (local.get $c)) (local.get $a)))
                (local.set $c (i32.add (local.get $s2) (i32.shl (local.get $u) (i32.const 3))))
                (f64.store (local.get $c) (f64.add (f64.load (local.get $c)) (local.get $b))))
              (else
                (local.set $c (i32.add (local.get $out) (i32.shl (local.get $u) (i32.const 4))))
                (f64.store (local.get $c) (local.get $a))
                (f64.store offset=8 (local.get $c) (local.get $b))))))
        (local.set $u (i32.add (local.get $u) (i32.const 1)))
        (br $column))))
)
