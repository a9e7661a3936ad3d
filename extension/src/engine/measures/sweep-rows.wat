;; The sampled measures' row sweep in WebAssembly: SweepRows.block, .row and .noRow of
;; measure-sample-rows.ts (with radiusBound, bucketBound, countInRanges, gatherDistances, twoRanks
;; and select-rank.ts's selectRank), the same IEEE double operations in the same order, so every
;; output is the same bits as the TypeScript's (test/measures-sweep-rows-wasm.test.ts compares
;; them). Any change here is made there too, and the other way round. scripts/build.mjs turns this
;; text into the module the bundles carry (sweep-rows-wasm.ts loads it).
;;
;; Arrays are byte offsets into the one memory (shared between the threads that sweep blocks of
;; one sweep; each thread has its own instance, so its own globals, and its own scratch). Indices
;; are i32; an f64 array's entry t is at ptr + 8t, an i32's at ptr + 4t, valid's at ptr + t.
;; Written differently where that keeps every double and costs less here (the profile of each is in
;; docs/performance.md, "the sample sweep's rows in WebAssembly"):
;; - the k-NN offers are a pass of their own over the row's scores, kept from the first pass (the
;;   same scores, offered in the same column order, so the same list, ties and kept-aside values);
;;   once the list is full, scores below listFloor (under every `keep` the list can still have)
;;   are passed over two at a time without an offer: the offer would refuse them, and a refused
;;   score changes nothing;
;; - near[nNear++] = d is written without a branch (a store past the count is scratch);
;; - binOf is written out in the loop (a call there spills the loop's doubles), and the row's pair
;;   counts go to four interleaved integer tables added to the block's histogram at the row's end:
;;   the histogram holds whole numbers far below 2^53, so adding a count at once gives the double
;;   that adding its ones one by one gives;
;; - a block's valid rows are swept two at a time (rowPair), their first passes side by side in the
;;   two lanes of f64x2 values (SIMD): each lane does its row's operations in its row's order, so
;;   each row's sums are the bits of its own pass; the block's pair sums take the first row's terms,
;;   then the second's (kept aside in column order), as when the rows are swept one after the
;;   other. About 15% less CPU a sweep (docs/performance.md, "What-if: two rows a pass").
;; Where the TypeScript compares a double that Math.floor gave with an integer, this compares the
;; doubles first and converts only a value known to be a small integer (or −0), so NaN goes where
;; it goes there. Math.max(1, x) and Math.max(0, x) are f64.max: both give NaN for a NaN and +0
;; for (0, −0). NaN written where the TypeScript writes NaN is the constant 0x7ff8000000000000,
;; as JavaScript's.
(module
  (import "env" "memory" (memory 1 65536 shared))

  ;; The sweep's shape and where its arrays are (layout), and the state it reads (state).
  (global $m (mut i32) (i32.const 0))
  (global $k (mut i32) (i32.const 0))
  (global $blockRows (mut i32) (i32.const 0))
  (global $nbr (mut i32) (i32.const 0))      ;; out.knn.neighbors (u32, m·k)
  (global $sims (mut i32) (i32.const 0))     ;; out.knn.sims (m·k)
  (global $nnd (mut i32) (i32.const 0))      ;; out.nnDist (m·k)
  (global $z (mut i32) (i32.const 0))        ;; out.zScores
  (global $con (mut i32) (i32.const 0))      ;; out.contrast
  (global $slk (mut i32) (i32.const 0))      ;; out.slack
  (global $rmean (mut i32) (i32.const 0))    ;; out.rowMean
  (global $rmin (mut i32) (i32.const 0))     ;; out.rowMin
  (global $nbin (mut i32) (i32.const 0))     ;; out.nearBin (i32)
  (global $tgrp (mut i32) (i32.const 0))     ;; out.tieGroup (i32)
  (global $bpairs (mut i32) (i32.const 0))   ;; out.blockPairs (2 per block)
  (global $bbins (mut i32) (i32.const 0))    ;; out.blockBins (40 per block)
  (global $valid (mut i32) (i32.const 0))    ;; u8, m
  (global $norms (mut i32) (i32.const 0))    ;; this thread's squared norms (m)
  (global $best (mut i32) (i32.const 0))     ;; bestScore (k)
  (global $bpos (mut i32) (i32.const 0))     ;; bestPos (u32, k)
  (global $tie (mut i32) (i32.const 0))      ;; tieScore (m)
  (global $near (mut i32) (i32.const 0))     ;; near (m)
  (global $rscr (mut i32) (i32.const 0))     ;; rankScratch (m)
  (global $probe (mut i32) (i32.const 0))    ;; probe (ceil(m/8)+1)
  (global $buckets (mut i32) (i32.const 0))  ;; rankBuckets (i32, 256)
  (global $counts (mut i32) (i32.const 0))   ;; the rows' pair counts per bin, 4 interleaved sets a row of a pair (i32, 8·40; zero between rows)
  (global $rscr2 (mut i32) (i32.const 0))    ;; rankScratch of a pair's second row (m)
  (global $near2 (mut i32) (i32.const 0))    ;; near of a pair's second row (m)
  (global $eTail (mut i32) (i32.const 0))    ;; a pair's second row's pair terms d − shift, in column order (m)
  (global $gram (mut i32) (i32.const 0))     ;; the state's dot products (m·m)
  (global $scale (mut i32) (i32.const 0))    ;; the state's row scales (m)
  (global $shift (mut f64) (f64.const 0))
  (global $validTotal (mut i32) (i32.const 0))
  ;; The current block's histogram and running pair sums.
  (global $pairBins (mut i32) (i32.const 0))
  (global $pairSum (mut f64) (f64.const 0))
  (global $pairSumSq (mut f64) (f64.const 0))
  ;; countInRanges' answer (RANGES): the least value, the ranges per unit, the greatest value.
  (global $rLo (mut f64) (f64.const 0))
  (global $rPer (mut f64) (f64.const 0))
  (global $rHi (mut f64) (f64.const 0))
  ;; twoRanks' answer.
  (global $rank1 (mut f64) (f64.const 0))
  (global $rank2 (mut f64) (f64.const 0))

  (func (export "layout")
    (param $m i32) (param $k i32) (param $blockRows i32)
    (param $nbr i32) (param $sims i32) (param $nnd i32) (param $z i32) (param $con i32) (param $slk i32)
    (param $rmean i32) (param $rmin i32) (param $nbin i32) (param $tgrp i32) (param $bpairs i32) (param $bbins i32)
    (param $valid i32) (param $norms i32) (param $best i32) (param $bpos i32) (param $tie i32) (param $near i32)
    (param $rscr i32) (param $probe i32) (param $buckets i32) (param $counts i32)
    (param $rscr2 i32) (param $near2 i32) (param $eTail i32)
    (global.set $m (local.get $m)) (global.set $k (local.get $k)) (global.set $blockRows (local.get $blockRows))
    (global.set $nbr (local.get $nbr)) (global.set $sims (local.get $sims)) (global.set $nnd (local.get $nnd))
    (global.set $z (local.get $z)) (global.set $con (local.get $con)) (global.set $slk (local.get $slk))
    (global.set $rmean (local.get $rmean)) (global.set $rmin (local.get $rmin)) (global.set $nbin (local.get $nbin))
    (global.set $tgrp (local.get $tgrp)) (global.set $bpairs (local.get $bpairs)) (global.set $bbins (local.get $bbins))
    (global.set $valid (local.get $valid)) (global.set $norms (local.get $norms)) (global.set $best (local.get $best))
    (global.set $bpos (local.get $bpos)) (global.set $tie (local.get $tie)) (global.set $near (local.get $near))
    (global.set $rscr (local.get $rscr)) (global.set $probe (local.get $probe)) (global.set $buckets (local.get $buckets))
    (global.set $counts (local.get $counts))
    (global.set $rscr2 (local.get $rscr2)) (global.set $near2 (local.get $near2)) (global.set $eTail (local.get $eTail))
    (memory.fill (local.get $counts) (i32.const 0) (i32.const 1280)))

  ;; The state a sweep reads: SweepRows' constructor (squaredNorms, validTotal) for these inputs.
  (func (export "state") (param $gram i32) (param $scale i32) (param $shift f64)
    (local $i i32) (local $s f64) (local $n i32)
    (global.set $gram (local.get $gram))
    (global.set $scale (local.get $scale))
    (global.set $shift (local.get $shift))
    (block $done (loop $each
      (br_if $done (i32.ge_s (local.get $i) (global.get $m)))
      ;; norms[i] = gram[i·m + i] · rowScale[i] · rowScale[i]
      (local.set $s (f64.load (i32.add (global.get $scale) (i32.shl (local.get $i) (i32.const 3)))))
      (f64.store (i32.add (global.get $norms) (i32.shl (local.get $i) (i32.const 3)))
        (f64.mul (f64.mul
          (f64.load (i32.add (global.get $gram) (i32.shl (i32.add (i32.mul (local.get $i) (global.get $m)) (local.get $i)) (i32.const 3))))
          (local.get $s)) (local.get $s)))
      (if (i32.load8_u (i32.add (global.get $valid) (local.get $i)))
        (then (local.set $n (i32.add (local.get $n) (i32.const 1)))))
      (local.set $i (i32.add (local.get $i) (i32.const 1)))
      (br $each)))
    (global.set $validTotal (local.get $n)))

  ;; SweepRows.block(b): the block's rows in order, its pair sums and histogram.
  (func (export "block") (param $b i32)
    (local $i i32) (local $end i32) (local $t i32) (local $i2 i32)
    (local.set $i (i32.mul (local.get $b) (global.get $blockRows)))
    (local.set $end (i32.add (local.get $i) (global.get $blockRows)))
    (if (i32.gt_s (local.get $end) (global.get $m)) (then (local.set $end (global.get $m))))
    (global.set $pairBins (i32.add (global.get $bbins) (i32.mul (local.get $b) (i32.const 320))))
    (block $cleared (loop $clear
      (br_if $cleared (i32.ge_s (local.get $t) (i32.const 40)))
      (f64.store (i32.add (global.get $pairBins) (i32.shl (local.get $t) (i32.const 3))) (f64.const 0))
      (local.set $t (i32.add (local.get $t) (i32.const 1)))
      (br $clear)))
    (global.set $pairSum (f64.const 0))
    (global.set $pairSumSq (f64.const 0))
    ;; The block's valid rows two at a time (rowPair: each row's operations in its own order, the
    ;; pair sums row after row), the last one of an odd count alone; the invalid ones in between.
    (block $done (loop $rows
      (br_if $done (i32.ge_s (local.get $i) (local.get $end)))
      (if (i32.eqz (i32.load8_u (i32.add (global.get $valid) (local.get $i)))) (then
        (call $noRow (local.get $i))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $rows)))
      (local.set $i2 (i32.add (local.get $i) (i32.const 1)))
      (block $found (loop $seek
        (br_if $found (i32.ge_s (local.get $i2) (local.get $end)))
        (br_if $found (i32.load8_u (i32.add (global.get $valid) (local.get $i2))))
        (call $noRow (local.get $i2))
        (local.set $i2 (i32.add (local.get $i2) (i32.const 1)))
        (br $seek)))
      (if (i32.ge_s (local.get $i2) (local.get $end)) (then
        (call $row (local.get $i))
        (br $done)))
      (call $rowPair (local.get $i) (local.get $i2))
      (local.set $i (i32.add (local.get $i2) (i32.const 1)))
      (br $rows)))
    (f64.store (i32.add (global.get $bpairs) (i32.shl (local.get $b) (i32.const 4))) (global.get $pairSum))
    (f64.store (i32.add (global.get $bpairs) (i32.add (i32.shl (local.get $b) (i32.const 4)) (i32.const 8))) (global.get $pairSumSq)))

  ;; SweepRows.noRow(i): an invalid row's outputs.
  (func $noRow (param $i i32)
    (local $r i32) (local $at i32)
    (block $done (loop $each
      (br_if $done (i32.ge_s (local.get $r) (global.get $k)))
      (local.set $at (i32.add (i32.mul (local.get $i) (global.get $k)) (local.get $r)))
      (i32.store (i32.add (global.get $nbr) (i32.shl (local.get $at) (i32.const 2))) (i32.const -1))
      (f64.store (i32.add (global.get $sims) (i32.shl (local.get $at) (i32.const 3))) (f64.const nan))
      (f64.store (i32.add (global.get $nnd) (i32.shl (local.get $at) (i32.const 3))) (f64.const nan))
      (local.set $r (i32.add (local.get $r) (i32.const 1)))
      (br $each)))
    (local.set $at (i32.shl (local.get $i) (i32.const 3)))
    (f64.store (i32.add (global.get $z) (local.get $at)) (f64.const nan))
    (f64.store (i32.add (global.get $con) (local.get $at)) (f64.const nan))
    (f64.store (i32.add (global.get $slk) (local.get $at)) (f64.const nan))
    (f64.store (i32.add (global.get $rmean) (local.get $at)) (f64.const nan))
    (f64.store (i32.add (global.get $rmin) (local.get $at)) (f64.const nan))
    (i32.store (i32.add (global.get $nbin) (i32.shl (local.get $i) (i32.const 2))) (i32.const -1))
    (i32.store (i32.add (global.get $tgrp) (i32.shl (local.get $i) (i32.const 2))) (i32.const 0)))

  ;; The row's (or the pair's) counts into the block's histogram (doubles that count in ones: adding
  ;; a count at once is the same double as adding its ones one by one, row after row), and the
  ;; counts cleared.
  (func $flushCounts
    (local $c i32) (local $at i32) (local $n i32) (local $set i32)
    (block $done (loop $each
      (br_if $done (i32.ge_s (local.get $c) (i32.const 40)))
      (local.set $n (i32.const 0))
      (local.set $set (i32.const 0))
      (block $summed (loop $sets
        (br_if $summed (i32.ge_s (local.get $set) (i32.const 8)))
        (local.set $n (i32.add (local.get $n)
          (i32.load (i32.add (global.get $counts) (i32.shl (i32.add (i32.mul (local.get $set) (i32.const 40)) (local.get $c)) (i32.const 2))))))
        (local.set $set (i32.add (local.get $set) (i32.const 1)))
        (br $sets)))
      (local.set $at (i32.add (global.get $pairBins) (i32.shl (local.get $c) (i32.const 3))))
      (f64.store (local.get $at) (f64.add (f64.load (local.get $at)) (f64.convert_i32_s (local.get $n))))
      (local.set $c (i32.add (local.get $c) (i32.const 1)))
      (br $each)))
    (memory.fill (global.get $counts) (i32.const 0) (i32.const 1280)))

  ;; binOf(s, 40) as an index, or −1 where binOf gives NaN (s NaN: a typed array ignores that index).
  (func $binOf (param $s f64) (result i32)
    (local $b f64)
    (local.set $b (f64.floor (f64.mul (local.get $s) (f64.const 40))))
    (if (f64.lt (local.get $b) (f64.const 0)) (then (return (i32.const 0))))
    (if (f64.ge (local.get $b) (f64.const 40)) (then (return (i32.const 39))))
    (if (f64.ne (local.get $b) (local.get $b)) (then (return (i32.const -1))))
    (i32.trunc_sat_f64_s (local.get $b)))

  ;; SweepRows.row(i): row i's part of every measure (i a valid row).
  (func $row (param $i i32)
    (local $m i32) (local $k i32) (local $base i32) (local $gramRow i32) (local $si f64) (local $ni f64)
    (local $limit f64) (local $filled i32) (local $bar f64) (local $keep f64) (local $ties i32) (local $nNear i32)
    (local $sum f64) (local $others i32) (local $first f64) (local $devSum f64) (local $devSumSq f64)
    (local $dMin f64) (local $dMax f64) (local $dSum f64) (local $eSum f64) (local $eSumSq f64)
    (local $j i32) (local $s f64) (local $nj f64) (local $sq f64) (local $d f64) (local $slot i32)
    (local $prev f64) (local $kth f64) (local $dev f64) (local $e f64) (local $bin i32) (local $at i32)
    (local $r i32) (local $nearest f64) (local $mean f64) (local $meanDev f64) (local $sd f64)
    (local $group i32) (local $last f64) (local $tol f64) (local $g i32) (local $far i32) (local $rK f64)
    (local $farRows i32) (local $pb i32) (local $b f64)
    (local.set $m (global.get $m))
    (local.set $k (global.get $k))
    (local.set $base (i32.mul (local.get $i) (local.get $m)))
    (local.set $gramRow (i32.add (global.get $gram) (i32.shl (local.get $base) (i32.const 3))))
    (local.set $si (f64.load (i32.add (global.get $scale) (i32.shl (local.get $i) (i32.const 3)))))
    (local.set $ni (f64.load (i32.add (global.get $norms) (i32.shl (local.get $i) (i32.const 3)))))
    ;; Math.min(10 * k, validTotal - 1)
    (local.set $farRows (i32.mul (i32.const 10) (local.get $k)))
    (if (i32.lt_s (i32.sub (global.get $validTotal) (i32.const 1)) (local.get $farRows))
      (then (local.set $farRows (i32.sub (global.get $validTotal) (i32.const 1)))))
    (local.set $limit (call $radiusBound (local.get $i) (local.get $farRows) (i32.sub (global.get $validTotal) (i32.const 1))))
    (local.set $first (f64.const nan))
    (local.set $dMin (f64.const inf))
    (local.set $dMax (f64.const -inf))
    (local.set $eSum (global.get $pairSum))
    (local.set $eSumSq (global.get $pairSumSq))
    (local.set $pb (global.get $pairBins))

    (block $swept (loop $cols
      (br_if $swept (i32.ge_s (local.get $j) (local.get $m)))
      (block $next
        (br_if $next (i32.eq (local.get $j) (local.get $i)))
        (br_if $next (i32.eqz (i32.load8_u (i32.add (global.get $valid) (local.get $j)))))
        (local.set $at (i32.shl (local.get $j) (i32.const 3)))
        ;; s = gram[base + j] · si · rowScale[j]
        (local.set $s (f64.mul (f64.mul (f64.load (i32.add (local.get $gramRow) (local.get $at))) (local.get $si))
          (f64.load (i32.add (global.get $scale) (local.get $at)))))
        (local.set $nj (f64.load (i32.add (global.get $norms) (local.get $at))))
        ;; sq = ni + nj − 2·s; d = sq > SAME_POINT·(ni + nj) ? √sq : 0
        (local.set $sq (f64.sub (f64.add (local.get $ni) (local.get $nj)) (f64.mul (f64.const 2) (local.get $s))))
        (local.set $d
          (select (f64.sqrt (local.get $sq)) (f64.const 0)
            (f64.gt (local.get $sq) (f64.mul (f64.const 1e-12) (f64.add (local.get $ni) (local.get $nj))))))
        ;; s kept for the k-NN's pass below (rankScratch: twoRanks needs it only after that pass)
        (f64.store (i32.add (global.get $rscr) (local.get $at)) (local.get $s))
        ;; near[nNear++] = d where sq <= limit, without a branch: the store past the count is scratch.
        (f64.store (i32.add (global.get $near) (i32.shl (local.get $nNear) (i32.const 3))) (local.get $d))
        (local.set $nNear (i32.add (local.get $nNear) (f64.le (local.get $sq) (local.get $limit))))
        (local.set $sum (f64.add (local.get $sum) (local.get $s)))
        (if (i32.eqz (local.get $others)) (then (local.set $first (local.get $s))))
        (local.set $dev (f64.sub (local.get $s) (local.get $first)))
        (local.set $devSum (f64.add (local.get $devSum) (local.get $dev)))
        (local.set $devSumSq (f64.add (local.get $devSumSq) (f64.mul (local.get $dev) (local.get $dev))))
        (local.set $others (i32.add (local.get $others) (i32.const 1)))
        (if (f64.lt (local.get $d) (local.get $dMin)) (then (local.set $dMin (local.get $d))))
        (if (f64.gt (local.get $d) (local.get $dMax)) (then (local.set $dMax (local.get $d))))
        (local.set $dSum (f64.add (local.get $dSum) (local.get $d)))
        (if (i32.gt_s (local.get $j) (local.get $i)) (then
          ;; binOf(s, 40) written out (a call here spills the loop's doubles): a NaN is not counted.
          (local.set $b (f64.floor (f64.mul (local.get $s) (f64.const 40))))
          (local.set $bin (i32.trunc_sat_f64_s (local.get $b)))
          (local.set $bin (select (i32.const 0) (local.get $bin) (i32.lt_s (local.get $bin) (i32.const 0))))
          (local.set $bin (select (i32.const 39) (local.get $bin) (i32.gt_s (local.get $bin) (i32.const 39))))
          (if (f64.eq (local.get $b) (local.get $b)) (then
            (local.set $at (i32.add (global.get $counts) (i32.shl (i32.add (i32.mul (i32.and (local.get $j) (i32.const 3)) (i32.const 40)) (local.get $bin)) (i32.const 2))))
            (i32.store (local.get $at) (i32.add (i32.load (local.get $at)) (i32.const 1)))))
          (local.set $e (f64.sub (local.get $d) (global.get $shift)))
          (local.set $eSum (f64.add (local.get $eSum) (local.get $e)))
          (local.set $eSumSq (f64.add (local.get $eSumSq) (f64.mul (local.get $e) (local.get $e)))))))
      (local.set $j (i32.add (local.get $j) (i32.const 1)))
      (br $cols)))
    (global.set $pairSum (local.get $eSum))
    (global.set $pairSumSq (local.get $eSumSq))
    (call $flushCounts)
    (call $finishRow (local.get $i) (global.get $rscr) (global.get $near) (local.get $nNear)
      (local.get $sum) (local.get $others) (local.get $devSum) (local.get $devSumSq) (local.get $dMin) (local.get $dMax) (local.get $dSum)))

  ;; The rest of row i's part once its first pass is done (SweepRows.row after its first loop): the
  ;; k-NN offers over the row's scores (at `scores`, by column), the list, the per-row summaries
  ;; and the radius slack (from the nNear distances at `nearAt`).
  (func $finishRow (param $i i32) (param $scores i32) (param $nearAt i32) (param $nNear i32)
    (param $sum f64) (param $others i32) (param $devSum f64) (param $devSumSq f64) (param $dMin f64) (param $dMax f64) (param $dSum f64)
    (local $m i32) (local $k i32) (local $ni f64)
    (local $filled i32) (local $bar f64) (local $keep f64) (local $ties i32)
    (local $j i32) (local $s f64) (local $nj f64) (local $sq f64) (local $slot i32)
    (local $prev f64) (local $kth f64) (local $at i32)
    (local $r i32) (local $nearest f64) (local $mean f64) (local $meanDev f64) (local $sd f64)
    (local $group i32) (local $last f64) (local $tol f64) (local $g i32) (local $far i32) (local $rK f64)
    (local $floor v128) (local $bits i32) (local $j1 i32)
    (local.set $m (global.get $m))
    (local.set $k (global.get $k))
    (local.set $ni (f64.load (i32.add (global.get $norms) (i32.shl (local.get $i) (i32.const 3)))))
    (local.set $bar (f64.const -inf))
    (local.set $keep (f64.const -inf))
    ;; The k-NN offers (the first pass's scores, in the same order): a pass of their own, since
    ;; in the first one their code cost more than it does here.
    (local.set $j (i32.const 0))
    (block $offered (loop $offers
      (br_if $offered (i32.ge_s (local.get $j) (local.get $m)))
      (block $skip
        (br_if $skip (i32.eq (local.get $j) (local.get $i)))
        (br_if $skip (i32.eqz (i32.load8_u (i32.add (global.get $valid) (local.get $j)))))
        (local.set $s (f64.load (i32.add (local.get $scores) (i32.shl (local.get $j) (i32.const 3)))))
        (if (f64.ge (local.get $s) (local.get $keep)) (then
          (f64.store (i32.add (global.get $tie) (i32.shl (local.get $ties) (i32.const 3))) (local.get $s))
          (local.set $ties (i32.add (local.get $ties) (i32.const 1)))
          (if (i32.or (i32.lt_s (local.get $filled) (local.get $k)) (f64.gt (local.get $s) (local.get $bar))) (then
            ;; nearestOfRow's rule: shift clearly worse entries down; equal scores stay ahead.
            (if (i32.lt_s (local.get $filled) (local.get $k))
              (then (local.set $slot (local.get $filled)) (local.set $filled (i32.add (local.get $filled) (i32.const 1))))
              (else (local.set $slot (i32.sub (local.get $k) (i32.const 1)))))
            (block $placed (loop $shift
              (br_if $placed (i32.le_s (local.get $slot) (i32.const 0)))
              (local.set $prev (f64.load (i32.add (global.get $best) (i32.shl (i32.sub (local.get $slot) (i32.const 1)) (i32.const 3)))))
              (br_if $placed (i32.eqz (f64.gt (local.get $s)
                (f64.add (local.get $prev) (f64.mul (f64.const 1e-12) (f64.max (f64.const 1) (f64.abs (local.get $prev))))))))
              (f64.store (i32.add (global.get $best) (i32.shl (local.get $slot) (i32.const 3))) (local.get $prev))
              (i32.store (i32.add (global.get $bpos) (i32.shl (local.get $slot) (i32.const 2)))
                (i32.load (i32.add (global.get $bpos) (i32.shl (i32.sub (local.get $slot) (i32.const 1)) (i32.const 2)))))
              (local.set $slot (i32.sub (local.get $slot) (i32.const 1)))
              (br $shift)))
            (f64.store (i32.add (global.get $best) (i32.shl (local.get $slot) (i32.const 3))) (local.get $s))
            (i32.store (i32.add (global.get $bpos) (i32.shl (local.get $slot) (i32.const 2))) (local.get $j))
            (if (i32.eq (local.get $filled) (local.get $k)) (then
              (local.set $kth (f64.load (i32.add (global.get $best) (i32.shl (i32.sub (local.get $k) (i32.const 1)) (i32.const 3)))))
              (local.set $bar (f64.add (local.get $kth) (f64.mul (f64.const 1e-12) (f64.max (f64.const 1) (f64.abs (local.get $kth))))))
              (local.set $keep (f64.sub (local.get $kth)
                (f64.mul (f64.mul (f64.const 4) (f64.const 1e-12)) (f64.max (f64.const 1) (f64.abs (local.get $kth)))))))))))))
      (local.set $j (i32.add (local.get $j) (i32.const 1)))
      ;; until the list is full; then the scan below
      (br_if $offers (i32.lt_s (local.get $filled) (local.get $k)))))
    ;; The list full, the rest of the scores two at a time against a floor below every `keep`
    ;; the list can have from here on (listFloor): a score below it would be refused by the
    ;; offer below, so it is passed over unread; the others are offered one by one, in column
    ;; order, exactly as above.
    (if (i32.eq (local.get $filled) (local.get $k)) (then
      (local.set $floor (f64x2.splat (call $listFloor)))
      (block $scanned (loop $scan
        (br_if $scanned (i32.ge_s (i32.add (local.get $j) (i32.const 1)) (local.get $m)))
        (local.set $bits (i64x2.bitmask (f64x2.ge (v128.load (i32.add (local.get $scores) (i32.shl (local.get $j) (i32.const 3)))) (local.get $floor))))
        (if (local.get $bits) (then
          (if (i32.and (local.get $bits) (i32.const 1)) (then
      (block $skip0
        (br_if $skip0 (i32.eq (local.get $j) (local.get $i)))
        (br_if $skip0 (i32.eqz (i32.load8_u (i32.add (global.get $valid) (local.get $j)))))
        (local.set $s (f64.load (i32.add (local.get $scores) (i32.shl (local.get $j) (i32.const 3)))))
        (if (f64.ge (local.get $s) (local.get $keep)) (then
          (f64.store (i32.add (global.get $tie) (i32.shl (local.get $ties) (i32.const 3))) (local.get $s))
          (local.set $ties (i32.add (local.get $ties) (i32.const 1)))
          (if (i32.or (i32.lt_s (local.get $filled) (local.get $k)) (f64.gt (local.get $s) (local.get $bar))) (then
            ;; nearestOfRow's rule: shift clearly worse entries down; equal scores stay ahead.
            (if (i32.lt_s (local.get $filled) (local.get $k))
              (then (local.set $slot (local.get $filled)) (local.set $filled (i32.add (local.get $filled) (i32.const 1))))
              (else (local.set $slot (i32.sub (local.get $k) (i32.const 1)))))
            (block $placed (loop $shift
              (br_if $placed (i32.le_s (local.get $slot) (i32.const 0)))
              (local.set $prev (f64.load (i32.add (global.get $best) (i32.shl (i32.sub (local.get $slot) (i32.const 1)) (i32.const 3)))))
              (br_if $placed (i32.eqz (f64.gt (local.get $s)
                (f64.add (local.get $prev) (f64.mul (f64.const 1e-12) (f64.max (f64.const 1) (f64.abs (local.get $prev))))))))
              (f64.store (i32.add (global.get $best) (i32.shl (local.get $slot) (i32.const 3))) (local.get $prev))
              (i32.store (i32.add (global.get $bpos) (i32.shl (local.get $slot) (i32.const 2)))
                (i32.load (i32.add (global.get $bpos) (i32.shl (i32.sub (local.get $slot) (i32.const 1)) (i32.const 2)))))
              (local.set $slot (i32.sub (local.get $slot) (i32.const 1)))
              (br $shift)))
            (f64.store (i32.add (global.get $best) (i32.shl (local.get $slot) (i32.const 3))) (local.get $s))
            (i32.store (i32.add (global.get $bpos) (i32.shl (local.get $slot) (i32.const 2))) (local.get $j))
            (if (i32.eq (local.get $filled) (local.get $k)) (then
              (local.set $kth (f64.load (i32.add (global.get $best) (i32.shl (i32.sub (local.get $k) (i32.const 1)) (i32.const 3)))))
              (local.set $bar (f64.add (local.get $kth) (f64.mul (f64.const 1e-12) (f64.max (f64.const 1) (f64.abs (local.get $kth))))))
              (local.set $keep (f64.sub (local.get $kth)
                (f64.mul (f64.mul (f64.const 4) (f64.const 1e-12)) (f64.max (f64.const 1) (f64.abs (local.get $kth)))))))))))))
          ))
          (if (i32.and (local.get $bits) (i32.const 2)) (then
            (local.set $j1 (i32.add (local.get $j) (i32.const 1)))
      (block $skip1
        (br_if $skip1 (i32.eq (local.get $j1) (local.get $i)))
        (br_if $skip1 (i32.eqz (i32.load8_u (i32.add (global.get $valid) (local.get $j1)))))
        (local.set $s (f64.load (i32.add (local.get $scores) (i32.shl (local.get $j1) (i32.const 3)))))
        (if (f64.ge (local.get $s) (local.get $keep)) (then
          (f64.store (i32.add (global.get $tie) (i32.shl (local.get $ties) (i32.const 3))) (local.get $s))
          (local.set $ties (i32.add (local.get $ties) (i32.const 1)))
          (if (i32.or (i32.lt_s (local.get $filled) (local.get $k)) (f64.gt (local.get $s) (local.get $bar))) (then
            ;; nearestOfRow's rule: shift clearly worse entries down; equal scores stay ahead.
            (if (i32.lt_s (local.get $filled) (local.get $k))
              (then (local.set $slot (local.get $filled)) (local.set $filled (i32.add (local.get $filled) (i32.const 1))))
              (else (local.set $slot (i32.sub (local.get $k) (i32.const 1)))))
            (block $placed (loop $shift
              (br_if $placed (i32.le_s (local.get $slot) (i32.const 0)))
              (local.set $prev (f64.load (i32.add (global.get $best) (i32.shl (i32.sub (local.get $slot) (i32.const 1)) (i32.const 3)))))
              (br_if $placed (i32.eqz (f64.gt (local.get $s)
                (f64.add (local.get $prev) (f64.mul (f64.const 1e-12) (f64.max (f64.const 1) (f64.abs (local.get $prev))))))))
              (f64.store (i32.add (global.get $best) (i32.shl (local.get $slot) (i32.const 3))) (local.get $prev))
              (i32.store (i32.add (global.get $bpos) (i32.shl (local.get $slot) (i32.const 2)))
                (i32.load (i32.add (global.get $bpos) (i32.shl (i32.sub (local.get $slot) (i32.const 1)) (i32.const 2)))))
              (local.set $slot (i32.sub (local.get $slot) (i32.const 1)))
              (br $shift)))
            (f64.store (i32.add (global.get $best) (i32.shl (local.get $slot) (i32.const 3))) (local.get $s))
            (i32.store (i32.add (global.get $bpos) (i32.shl (local.get $slot) (i32.const 2))) (local.get $j1))
            (if (i32.eq (local.get $filled) (local.get $k)) (then
              (local.set $kth (f64.load (i32.add (global.get $best) (i32.shl (i32.sub (local.get $k) (i32.const 1)) (i32.const 3)))))
              (local.set $bar (f64.add (local.get $kth) (f64.mul (f64.const 1e-12) (f64.max (f64.const 1) (f64.abs (local.get $kth))))))
              (local.set $keep (f64.sub (local.get $kth)
                (f64.mul (f64.mul (f64.const 4) (f64.const 1e-12)) (f64.max (f64.const 1) (f64.abs (local.get $kth)))))))))))))
          ))
          (local.set $floor (f64x2.splat (call $listFloor)))))
        (local.set $j (i32.add (local.get $j) (i32.const 2)))
        (br $scan)))
      (if (i32.lt_s (local.get $j) (local.get $m)) (then
      (block $skip2
        (br_if $skip2 (i32.eq (local.get $j) (local.get $i)))
        (br_if $skip2 (i32.eqz (i32.load8_u (i32.add (global.get $valid) (local.get $j)))))
        (local.set $s (f64.load (i32.add (local.get $scores) (i32.shl (local.get $j) (i32.const 3)))))
        (if (f64.ge (local.get $s) (local.get $keep)) (then
          (f64.store (i32.add (global.get $tie) (i32.shl (local.get $ties) (i32.const 3))) (local.get $s))
          (local.set $ties (i32.add (local.get $ties) (i32.const 1)))
          (if (i32.or (i32.lt_s (local.get $filled) (local.get $k)) (f64.gt (local.get $s) (local.get $bar))) (then
            ;; nearestOfRow's rule: shift clearly worse entries down; equal scores stay ahead.
            (if (i32.lt_s (local.get $filled) (local.get $k))
              (then (local.set $slot (local.get $filled)) (local.set $filled (i32.add (local.get $filled) (i32.const 1))))
              (else (local.set $slot (i32.sub (local.get $k) (i32.const 1)))))
            (block $placed (loop $shift
              (br_if $placed (i32.le_s (local.get $slot) (i32.const 0)))
              (local.set $prev (f64.load (i32.add (global.get $best) (i32.shl (i32.sub (local.get $slot) (i32.const 1)) (i32.const 3)))))
              (br_if $placed (i32.eqz (f64.gt (local.get $s)
                (f64.add (local.get $prev) (f64.mul (f64.const 1e-12) (f64.max (f64.const 1) (f64.abs (local.get $prev))))))))
              (f64.store (i32.add (global.get $best) (i32.shl (local.get $slot) (i32.const 3))) (local.get $prev))
              (i32.store (i32.add (global.get $bpos) (i32.shl (local.get $slot) (i32.const 2)))
                (i32.load (i32.add (global.get $bpos) (i32.shl (i32.sub (local.get $slot) (i32.const 1)) (i32.const 2)))))
              (local.set $slot (i32.sub (local.get $slot) (i32.const 1)))
              (br $shift)))
            (f64.store (i32.add (global.get $best) (i32.shl (local.get $slot) (i32.const 3))) (local.get $s))
            (i32.store (i32.add (global.get $bpos) (i32.shl (local.get $slot) (i32.const 2))) (local.get $j))
            (if (i32.eq (local.get $filled) (local.get $k)) (then
              (local.set $kth (f64.load (i32.add (global.get $best) (i32.shl (i32.sub (local.get $k) (i32.const 1)) (i32.const 3)))))
              (local.set $bar (f64.add (local.get $kth) (f64.mul (f64.const 1e-12) (f64.max (f64.const 1) (f64.abs (local.get $kth))))))
              (local.set $keep (f64.sub (local.get $kth)
                (f64.mul (f64.mul (f64.const 4) (f64.const 1e-12)) (f64.max (f64.const 1) (f64.abs (local.get $kth)))))))))))))
      ))))

    (block $listed (loop $list
      (br_if $listed (i32.ge_s (local.get $r) (local.get $k)))
      (local.set $at (i32.add (i32.mul (local.get $i) (local.get $k)) (local.get $r)))
      (if (i32.ge_s (local.get $r) (local.get $filled))
        (then
          (i32.store (i32.add (global.get $nbr) (i32.shl (local.get $at) (i32.const 2))) (i32.const -1))
          (f64.store (i32.add (global.get $sims) (i32.shl (local.get $at) (i32.const 3))) (f64.const nan))
          (f64.store (i32.add (global.get $nnd) (i32.shl (local.get $at) (i32.const 3))) (f64.const nan)))
        (else
          (local.set $j (i32.load (i32.add (global.get $bpos) (i32.shl (local.get $r) (i32.const 2)))))
          (local.set $s (f64.load (i32.add (global.get $best) (i32.shl (local.get $r) (i32.const 3)))))
          (i32.store (i32.add (global.get $nbr) (i32.shl (local.get $at) (i32.const 2))) (local.get $j))
          (f64.store (i32.add (global.get $sims) (i32.shl (local.get $at) (i32.const 3))) (local.get $s))
          (local.set $nj (f64.load (i32.add (global.get $norms) (i32.shl (local.get $j) (i32.const 3)))))
          (local.set $sq (f64.sub (f64.add (local.get $ni) (local.get $nj)) (f64.mul (f64.const 2) (local.get $s))))
          (f64.store (i32.add (global.get $nnd) (i32.shl (local.get $at) (i32.const 3)))
            (select (f64.sqrt (local.get $sq)) (f64.const 0)
              (f64.gt (local.get $sq) (f64.mul (f64.const 1e-12) (f64.add (local.get $ni) (local.get $nj))))))))
      (local.set $r (i32.add (local.get $r) (i32.const 1)))
      (br $list)))
    (local.set $nearest (f64.const nan))
    (if (i32.gt_s (local.get $filled) (i32.const 0)) (then (local.set $nearest (f64.load (global.get $best)))))
    (i32.store (i32.add (global.get $nbin) (i32.shl (local.get $i) (i32.const 2)))
      (if (result i32) (f64.ne (local.get $nearest) (local.get $nearest))
        (then (i32.const -1)) (else (call $binOf (local.get $nearest)))))
    (local.set $at (i32.shl (local.get $i) (i32.const 3)))
    (f64.store (i32.add (global.get $con) (local.get $at))
      (if (result f64) (i32.and (f64.gt (local.get $dMin) (f64.const 0)) (f64.lt (local.get $dMin) (f64.const inf)))
        (then (f64.div (f64.sub (local.get $dMax) (local.get $dMin)) (local.get $dMin))) (else (f64.const nan))))
    (f64.store (i32.add (global.get $rmean) (local.get $at))
      (if (result f64) (i32.gt_s (local.get $others) (i32.const 0))
        (then (f64.div (local.get $dSum) (f64.convert_i32_s (local.get $others)))) (else (f64.const nan))))
    (f64.store (i32.add (global.get $rmin) (local.get $at))
      (if (result f64) (i32.gt_s (local.get $others) (i32.const 0)) (then (local.get $dMin)) (else (f64.const nan))))
    ;; standout (standoutGivenSum): the z-score of the nearest similarity
    (f64.store (i32.add (global.get $z) (local.get $at)) (f64.const nan))
    (if (i32.and (i32.ge_s (local.get $others) (i32.const 2)) (f64.eq (local.get $nearest) (local.get $nearest))) (then
      (local.set $mean (f64.div (local.get $sum) (f64.convert_i32_s (local.get $others))))
      (local.set $meanDev (f64.div (local.get $devSum) (f64.convert_i32_s (local.get $others))))
      (local.set $sd (f64.sqrt (f64.max (f64.const 0)
        (f64.sub (f64.div (local.get $devSumSq) (f64.convert_i32_s (local.get $others))) (f64.mul (local.get $meanDev) (local.get $meanDev))))))
      (if (f64.gt (local.get $sd) (f64.mul (f64.const 1e-12) (f64.max (f64.const 1) (f64.abs (local.get $mean))))) (then
        (f64.store (i32.add (global.get $z) (local.get $at))
          (f64.div (f64.sub (local.get $nearest) (local.get $mean)) (local.get $sd)))))))
    ;; N_k's tie group: the values kept aside that are tied with the k-th
    (if (i32.gt_s (local.get $filled) (i32.const 0)) (then
      (local.set $last (f64.load (i32.add (global.get $best) (i32.shl (i32.sub (local.get $filled) (i32.const 1)) (i32.const 3)))))
      (local.set $tol (f64.mul (f64.const 1e-12) (f64.max (f64.const 1) (f64.abs (local.get $last)))))
      (block $counted (loop $count
        (br_if $counted (i32.ge_s (local.get $g) (local.get $ties)))
        (if (f64.le (f64.abs (f64.sub (f64.load (i32.add (global.get $tie) (i32.shl (local.get $g) (i32.const 3)))) (local.get $last))) (local.get $tol))
          (then (local.set $group (i32.add (local.get $group) (i32.const 1)))))
        (local.set $g (i32.add (local.get $g) (i32.const 1)))
        (br $count)))))
    (i32.store (i32.add (global.get $tgrp) (i32.shl (local.get $i) (i32.const 2))) (local.get $group))
    ;; radius slack: the k-th and the 10k-th smallest distance of the row
    (f64.store (i32.add (global.get $slk) (local.get $at)) (f64.const nan))
    (if (i32.ge_s (local.get $others) (local.get $k)) (then
      (local.set $far (i32.mul (i32.const 10) (local.get $k)))
      (if (i32.lt_s (local.get $others) (local.get $far)) (then (local.set $far (local.get $others))))
      (if (i32.lt_s (local.get $nNear) (local.get $far)) (then (local.set $nNear (call $gatherDistances (local.get $i) (local.get $nearAt)))))
      (call $twoRanks (local.get $nearAt) (local.get $nNear) (i32.sub (local.get $k) (i32.const 1)) (i32.sub (local.get $far) (i32.const 1)))
      (local.set $rK (global.get $rank1))
      (if (f64.gt (local.get $rK) (f64.const 0)) (then
        (f64.store (i32.add (global.get $slk) (local.get $at))
          (f64.div (f64.sub (global.get $rank2) (local.get $rK)) (local.get $rK))))))))

  ;; SweepRows.row(i1) and .row(i2) for two valid rows i1 < i2 of one block with no valid row
  ;; between them, their first passes side by side: i1's values in lane 0 of each f64x2, i2's in
  ;; lane 1, each lane with the scalar $row's operations in its order (columns ascending), so the
  ;; same bits. Column i2 of row i1 and column i1 of row i2 are their lane's alone (lane by lane, as
  ;; in $row). A row's `others` is validTotal − 1 (every valid column but its own), and its
  ;; `first` the score of the first of them. The block's pair sums run down i1's terms, then
  ;; i2's (kept aside in column order), as when the rows are swept one after the other; the pair
  ;; counts are whole numbers, so the order they are counted in changes nothing.
  (func $rowPair (param $i1 i32) (param $i2 i32)
    (local $m i32) (local $farRows i32) (local $others i32) (local $end i32)
    (local $g1 i32) (local $g2 i32) (local $s1 i32) (local $s2 i32) (local $n1 i32) (local $n2 i32)
    (local $nNear1 i32) (local $nNear2 i32) (local $nTail i32) (local $j i32) (local $at i32)
    (local $bits i32) (local $q i32) (local $c i32) (local $t i32)
    (local $si v128) (local $ni v128) (local $limit v128) (local $first v128) (local $shift v128)
    (local $sum v128) (local $devSum v128) (local $devSumSq v128) (local $dMin v128) (local $dMax v128) (local $dSum v128)
    (local $s v128) (local $nn v128) (local $sq v128) (local $d v128) (local $dev v128) (local $b v128) (local $e v128) (local $bin v128)
    (local $eSum f64) (local $eSumSq f64) (local $x f64) (local $eL f64)
    (local $sc f64) (local $nj f64) (local $niL f64) (local $sqL f64) (local $dL f64) (local $devL f64) (local $bL f64)
    (local.set $m (global.get $m))
    (local.set $g1 (i32.add (global.get $gram) (i32.shl (i32.mul (local.get $i1) (local.get $m)) (i32.const 3))))
    (local.set $g2 (i32.add (global.get $gram) (i32.shl (i32.mul (local.get $i2) (local.get $m)) (i32.const 3))))
    (local.set $s1 (global.get $rscr))
    (local.set $s2 (global.get $rscr2))
    (local.set $n1 (global.get $near))
    (local.set $n2 (global.get $near2))
    (local.set $si (f64x2.replace_lane 1
      (f64x2.splat (f64.load (i32.add (global.get $scale) (i32.shl (local.get $i1) (i32.const 3)))))
      (f64.load (i32.add (global.get $scale) (i32.shl (local.get $i2) (i32.const 3))))))
    (local.set $ni (f64x2.replace_lane 1
      (f64x2.splat (f64.load (i32.add (global.get $norms) (i32.shl (local.get $i1) (i32.const 3)))))
      (f64.load (i32.add (global.get $norms) (i32.shl (local.get $i2) (i32.const 3))))))
    (local.set $shift (f64x2.splat (global.get $shift)))
    (local.set $others (i32.sub (global.get $validTotal) (i32.const 1)))
    ;; Math.min(10 * k, validTotal - 1)
    (local.set $farRows (i32.mul (i32.const 10) (global.get $k)))
    (if (i32.lt_s (local.get $others) (local.get $farRows)) (then (local.set $farRows (local.get $others))))
    (local.set $limit (f64x2.replace_lane 1
      (f64x2.splat (call $radiusBound (local.get $i1) (local.get $farRows) (local.get $others)))
      (call $radiusBound (local.get $i2) (local.get $farRows) (local.get $others))))
    ;; the lane's first score: that of the first valid column other than its row (the scalar's `first`)
    (local.set $j (i32.const 0))
    (block $found0 (loop $seek0
      (br_if $found0 (i32.and (i32.ne (local.get $j) (local.get $i1)) (i32.load8_u (i32.add (global.get $valid) (local.get $j)))))
      (local.set $j (i32.add (local.get $j) (i32.const 1)))
      (br $seek0)))
    (local.set $at (i32.shl (local.get $j) (i32.const 3)))
    (local.set $first (f64x2.replace_lane 0 (local.get $first)
      (f64.mul (f64.mul (f64.load (i32.add (local.get $g1) (local.get $at))) (f64x2.extract_lane 0 (local.get $si)))
        (f64.load (i32.add (global.get $scale) (local.get $at))))))
    ;; the lane's first score: that of the first valid column other than its row (the scalar's `first`)
    (local.set $j (i32.const 0))
    (block $found1 (loop $seek1
      (br_if $found1 (i32.and (i32.ne (local.get $j) (local.get $i2)) (i32.load8_u (i32.add (global.get $valid) (local.get $j)))))
      (local.set $j (i32.add (local.get $j) (i32.const 1)))
      (br $seek1)))
    (local.set $at (i32.shl (local.get $j) (i32.const 3)))
    (local.set $first (f64x2.replace_lane 1 (local.get $first)
      (f64.mul (f64.mul (f64.load (i32.add (local.get $g2) (local.get $at))) (f64x2.extract_lane 1 (local.get $si)))
        (f64.load (i32.add (global.get $scale) (local.get $at))))))
    (local.set $dMin (v128.const f64x2 inf inf))
    (local.set $dMax (v128.const f64x2 -inf -inf))
    (local.set $eSum (global.get $pairSum))
    (local.set $eSumSq (global.get $pairSumSq))

    ;; Columns [0, i1): both rows, no pair counted (j < i1 < i2).
    (local.set $end (local.get $i1))
    (block $sweptA (loop $colsA
      (br_if $sweptA (i32.ge_s (local.get $j) (local.get $end)))
      (block $next
        (br_if $next (i32.eqz (i32.load8_u (i32.add (global.get $valid) (local.get $j)))))
        (local.set $at (i32.shl (local.get $j) (i32.const 3)))
        ;; s = gram[base + j] · si · rowScale[j], for i1 in lane 0 and i2 in lane 1
        (local.set $s (f64x2.mul (f64x2.mul
          (v128.load64_lane 1 (i32.add (local.get $g2) (local.get $at)) (v128.load64_splat (i32.add (local.get $g1) (local.get $at))))
          (local.get $si))
          (v128.load64_splat (i32.add (global.get $scale) (local.get $at)))))
        ;; ni + nj; sq = ni + nj − 2·s; d = sq > SAME_POINT·(ni + nj) ? √sq : 0
        (local.set $nn (f64x2.add (local.get $ni) (v128.load64_splat (i32.add (global.get $norms) (local.get $at)))))
        (local.set $sq (f64x2.sub (local.get $nn) (f64x2.mul (v128.const f64x2 2 2) (local.get $s))))
        (local.set $d (v128.bitselect (f64x2.sqrt (local.get $sq)) (v128.const i64x2 0 0)
          (f64x2.gt (local.get $sq) (f64x2.mul (v128.const f64x2 1e-12 1e-12) (local.get $nn)))))
        (v128.store64_lane 0 (i32.add (local.get $s1) (local.get $at)) (local.get $s))
        (v128.store64_lane 1 (i32.add (local.get $s2) (local.get $at)) (local.get $s))
        (v128.store64_lane 0 (i32.add (local.get $n1) (i32.shl (local.get $nNear1) (i32.const 3))) (local.get $d))
        (v128.store64_lane 1 (i32.add (local.get $n2) (i32.shl (local.get $nNear2) (i32.const 3))) (local.get $d))
        (local.set $bits (i64x2.bitmask (f64x2.le (local.get $sq) (local.get $limit))))
        (local.set $nNear1 (i32.add (local.get $nNear1) (i32.and (local.get $bits) (i32.const 1))))
        (local.set $nNear2 (i32.add (local.get $nNear2) (i32.shr_u (local.get $bits) (i32.const 1))))
        (local.set $sum (f64x2.add (local.get $sum) (local.get $s)))
        (local.set $dev (f64x2.sub (local.get $s) (local.get $first)))
        (local.set $devSum (f64x2.add (local.get $devSum) (local.get $dev)))
        (local.set $devSumSq (f64x2.add (local.get $devSumSq) (f64x2.mul (local.get $dev) (local.get $dev))))
        (local.set $dMin (v128.bitselect (local.get $d) (local.get $dMin) (f64x2.lt (local.get $d) (local.get $dMin))))
        (local.set $dMax (v128.bitselect (local.get $d) (local.get $dMax) (f64x2.gt (local.get $d) (local.get $dMax))))
        (local.set $dSum (f64x2.add (local.get $dSum) (local.get $d))))
      (local.set $j (i32.add (local.get $j) (i32.const 1)))
      (br $colsA)))
    ;; Column i1: row i2's alone (j < i2: no pair).
    (local.set $j (local.get $i1))
        (local.set $at (i32.shl (local.get $j) (i32.const 3)))
        (local.set $sc (f64.mul (f64.mul (f64.load (i32.add (local.get $g2) (local.get $at))) (f64x2.extract_lane 1 (local.get $si)))
          (f64.load (i32.add (global.get $scale) (local.get $at)))))
        (local.set $nj (f64.load (i32.add (global.get $norms) (local.get $at))))
        (local.set $niL (f64x2.extract_lane 1 (local.get $ni)))
        (local.set $sqL (f64.sub (f64.add (local.get $niL) (local.get $nj)) (f64.mul (f64.const 2) (local.get $sc))))
        (local.set $dL
          (select (f64.sqrt (local.get $sqL)) (f64.const 0)
            (f64.gt (local.get $sqL) (f64.mul (f64.const 1e-12) (f64.add (local.get $niL) (local.get $nj))))))
        (f64.store (i32.add (local.get $s2) (local.get $at)) (local.get $sc))
        (f64.store (i32.add (local.get $n2) (i32.shl (local.get $nNear2) (i32.const 3))) (local.get $dL))
        (local.set $nNear2 (i32.add (local.get $nNear2) (f64.le (local.get $sqL) (f64x2.extract_lane 1 (local.get $limit)))))
        (local.set $x (f64x2.extract_lane 1 (local.get $sum)))
        (local.set $sum (f64x2.replace_lane 1 (local.get $sum) (f64.add (local.get $x) (local.get $sc))))
        (local.set $devL (f64.sub (local.get $sc) (f64x2.extract_lane 1 (local.get $first))))
        (local.set $x (f64x2.extract_lane 1 (local.get $devSum)))
        (local.set $devSum (f64x2.replace_lane 1 (local.get $devSum) (f64.add (local.get $x) (local.get $devL))))
        (local.set $x (f64x2.extract_lane 1 (local.get $devSumSq)))
        (local.set $devSumSq (f64x2.replace_lane 1 (local.get $devSumSq) (f64.add (local.get $x) (f64.mul (local.get $devL) (local.get $devL)))))
        (if (f64.lt (local.get $dL) (f64x2.extract_lane 1 (local.get $dMin))) (then (local.set $dMin (f64x2.replace_lane 1 (local.get $dMin) (local.get $dL)))))
        (if (f64.gt (local.get $dL) (f64x2.extract_lane 1 (local.get $dMax))) (then (local.set $dMax (f64x2.replace_lane 1 (local.get $dMax) (local.get $dL)))))
        (local.set $x (f64x2.extract_lane 1 (local.get $dSum)))
        (local.set $dSum (f64x2.replace_lane 1 (local.get $dSum) (f64.add (local.get $x) (local.get $dL))))
    ;; Columns between i1 and i2 are invalid. Column i2: row i1's alone (j > i1: a pair).
    (local.set $j (local.get $i2))
        (local.set $at (i32.shl (local.get $j) (i32.const 3)))
        (local.set $sc (f64.mul (f64.mul (f64.load (i32.add (local.get $g1) (local.get $at))) (f64x2.extract_lane 0 (local.get $si)))
          (f64.load (i32.add (global.get $scale) (local.get $at)))))
        (local.set $nj (f64.load (i32.add (global.get $norms) (local.get $at))))
        (local.set $niL (f64x2.extract_lane 0 (local.get $ni)))
        (local.set $sqL (f64.sub (f64.add (local.get $niL) (local.get $nj)) (f64.mul (f64.const 2) (local.get $sc))))
        (local.set $dL
          (select (f64.sqrt (local.get $sqL)) (f64.const 0)
            (f64.gt (local.get $sqL) (f64.mul (f64.const 1e-12) (f64.add (local.get $niL) (local.get $nj))))))
        (f64.store (i32.add (local.get $s1) (local.get $at)) (local.get $sc))
        (f64.store (i32.add (local.get $n1) (i32.shl (local.get $nNear1) (i32.const 3))) (local.get $dL))
        (local.set $nNear1 (i32.add (local.get $nNear1) (f64.le (local.get $sqL) (f64x2.extract_lane 0 (local.get $limit)))))
        (local.set $x (f64x2.extract_lane 0 (local.get $sum)))
        (local.set $sum (f64x2.replace_lane 0 (local.get $sum) (f64.add (local.get $x) (local.get $sc))))
        (local.set $devL (f64.sub (local.get $sc) (f64x2.extract_lane 0 (local.get $first))))
        (local.set $x (f64x2.extract_lane 0 (local.get $devSum)))
        (local.set $devSum (f64x2.replace_lane 0 (local.get $devSum) (f64.add (local.get $x) (local.get $devL))))
        (local.set $x (f64x2.extract_lane 0 (local.get $devSumSq)))
        (local.set $devSumSq (f64x2.replace_lane 0 (local.get $devSumSq) (f64.add (local.get $x) (f64.mul (local.get $devL) (local.get $devL)))))
        (if (f64.lt (local.get $dL) (f64x2.extract_lane 0 (local.get $dMin))) (then (local.set $dMin (f64x2.replace_lane 0 (local.get $dMin) (local.get $dL)))))
        (if (f64.gt (local.get $dL) (f64x2.extract_lane 0 (local.get $dMax))) (then (local.set $dMax (f64x2.replace_lane 0 (local.get $dMax) (local.get $dL)))))
        (local.set $x (f64x2.extract_lane 0 (local.get $dSum)))
        (local.set $dSum (f64x2.replace_lane 0 (local.get $dSum) (f64.add (local.get $x) (local.get $dL))))
        (local.set $bL (f64.floor (f64.mul (local.get $sc) (f64.const 40))))
        (local.set $c (i32.trunc_sat_f64_s (local.get $bL)))
        (local.set $c (select (i32.const 0) (local.get $c) (i32.lt_s (local.get $c) (i32.const 0))))
        (local.set $c (select (i32.const 39) (local.get $c) (i32.gt_s (local.get $c) (i32.const 39))))
        (if (f64.eq (local.get $bL) (local.get $bL)) (then
          (local.set $c (i32.add (global.get $counts) (i32.shl (i32.add (i32.mul (i32.add (i32.and (local.get $j) (i32.const 3)) (i32.const 0)) (i32.const 40)) (local.get $c)) (i32.const 2))))
          (i32.store (local.get $c) (i32.add (i32.load (local.get $c)) (i32.const 1)))))
        (local.set $eL (f64.sub (local.get $dL) (global.get $shift)))
        (local.set $eSum (f64.add (local.get $eSum) (local.get $eL)))
        (local.set $eSumSq (f64.add (local.get $eSumSq) (f64.mul (local.get $eL) (local.get $eL))))
    ;; Columns (i2, m): both rows, both pairs counted.
    (local.set $j (i32.add (local.get $i2) (i32.const 1)))
    (block $sweptC (loop $colsC
      (br_if $sweptC (i32.ge_s (local.get $j) (local.get $m)))
      (block $nextC
        (br_if $nextC (i32.eqz (i32.load8_u (i32.add (global.get $valid) (local.get $j)))))
        (local.set $at (i32.shl (local.get $j) (i32.const 3)))
        ;; s = gram[base + j] · si · rowScale[j], for i1 in lane 0 and i2 in lane 1
        (local.set $s (f64x2.mul (f64x2.mul
          (v128.load64_lane 1 (i32.add (local.get $g2) (local.get $at)) (v128.load64_splat (i32.add (local.get $g1) (local.get $at))))
          (local.get $si))
          (v128.load64_splat (i32.add (global.get $scale) (local.get $at)))))
        ;; ni + nj; sq = ni + nj − 2·s; d = sq > SAME_POINT·(ni + nj) ? √sq : 0
        (local.set $nn (f64x2.add (local.get $ni) (v128.load64_splat (i32.add (global.get $norms) (local.get $at)))))
        (local.set $sq (f64x2.sub (local.get $nn) (f64x2.mul (v128.const f64x2 2 2) (local.get $s))))
        (local.set $d (v128.bitselect (f64x2.sqrt (local.get $sq)) (v128.const i64x2 0 0)
          (f64x2.gt (local.get $sq) (f64x2.mul (v128.const f64x2 1e-12 1e-12) (local.get $nn)))))
        (v128.store64_lane 0 (i32.add (local.get $s1) (local.get $at)) (local.get $s))
        (v128.store64_lane 1 (i32.add (local.get $s2) (local.get $at)) (local.get $s))
        (v128.store64_lane 0 (i32.add (local.get $n1) (i32.shl (local.get $nNear1) (i32.const 3))) (local.get $d))
        (v128.store64_lane 1 (i32.add (local.get $n2) (i32.shl (local.get $nNear2) (i32.const 3))) (local.get $d))
        (local.set $bits (i64x2.bitmask (f64x2.le (local.get $sq) (local.get $limit))))
        (local.set $nNear1 (i32.add (local.get $nNear1) (i32.and (local.get $bits) (i32.const 1))))
        (local.set $nNear2 (i32.add (local.get $nNear2) (i32.shr_u (local.get $bits) (i32.const 1))))
        (local.set $sum (f64x2.add (local.get $sum) (local.get $s)))
        (local.set $dev (f64x2.sub (local.get $s) (local.get $first)))
        (local.set $devSum (f64x2.add (local.get $devSum) (local.get $dev)))
        (local.set $devSumSq (f64x2.add (local.get $devSumSq) (f64x2.mul (local.get $dev) (local.get $dev))))
        (local.set $dMin (v128.bitselect (local.get $d) (local.get $dMin) (f64x2.lt (local.get $d) (local.get $dMin))))
        (local.set $dMax (v128.bitselect (local.get $d) (local.get $dMax) (f64x2.gt (local.get $d) (local.get $dMax))))
        (local.set $dSum (f64x2.add (local.get $dSum) (local.get $d)))
          ;; binOf(s, 40) per lane (a NaN counts 0), into lane 0's sets 0–3 and lane 1's 4–7
          (local.set $b (f64x2.floor (f64x2.mul (local.get $s) (v128.const f64x2 40 40))))
          (local.set $bin (i32x4.min_s (i32x4.max_s (i32x4.trunc_sat_f64x2_s_zero (local.get $b)) (v128.const i32x4 0 0 0 0)) (v128.const i32x4 39 39 39 39)))
          (local.set $bits (i64x2.bitmask (f64x2.eq (local.get $b) (local.get $b))))
          (local.set $q (i32.mul (i32.and (local.get $j) (i32.const 3)) (i32.const 40)))
          (local.set $c (i32.add (global.get $counts) (i32.shl (i32.add (local.get $q) (i32x4.extract_lane 0 (local.get $bin))) (i32.const 2))))
          (i32.store (local.get $c) (i32.add (i32.load (local.get $c)) (i32.and (local.get $bits) (i32.const 1))))
          (local.set $c (i32.add (global.get $counts) (i32.shl (i32.add (i32.add (local.get $q) (i32.const 160)) (i32x4.extract_lane 1 (local.get $bin))) (i32.const 2))))
          (i32.store (local.get $c) (i32.add (i32.load (local.get $c)) (i32.shr_u (local.get $bits) (i32.const 1))))
          ;; the pair sums' terms: i1's added now, i2's kept for after i1's
          (local.set $e (f64x2.sub (local.get $d) (local.get $shift)))
          (local.set $eL (f64x2.extract_lane 0 (local.get $e)))
          (local.set $eSum (f64.add (local.get $eSum) (local.get $eL)))
          (local.set $eSumSq (f64.add (local.get $eSumSq) (f64.mul (local.get $eL) (local.get $eL))))
          (v128.store64_lane 1 (i32.add (global.get $eTail) (i32.shl (local.get $nTail) (i32.const 3))) (local.get $e))
          (local.set $nTail (i32.add (local.get $nTail) (i32.const 1))))
      (local.set $j (i32.add (local.get $j) (i32.const 1)))
      (br $colsC)))
    ;; The pair sums: i2's terms after i1's.
    (block $added (loop $add
      (br_if $added (i32.ge_s (local.get $t) (local.get $nTail)))
      (local.set $eL (f64.load (i32.add (global.get $eTail) (i32.shl (local.get $t) (i32.const 3)))))
      (local.set $eSum (f64.add (local.get $eSum) (local.get $eL)))
      (local.set $eSumSq (f64.add (local.get $eSumSq) (f64.mul (local.get $eL) (local.get $eL))))
      (local.set $t (i32.add (local.get $t) (i32.const 1)))
      (br $add)))
    (global.set $pairSum (local.get $eSum))
    (global.set $pairSumSq (local.get $eSumSq))
    (call $flushCounts)
    ;; i1's rest, then i2's (whose scores and distances are in the second row's scratch; i1's
    ;; twoRanks may use rankScratch, i1's scores, once i1's offers are done).
    (call $finishRow (local.get $i1) (local.get $s1) (local.get $n1) (local.get $nNear1)
      (f64x2.extract_lane 0 (local.get $sum)) (local.get $others) (f64x2.extract_lane 0 (local.get $devSum)) (f64x2.extract_lane 0 (local.get $devSumSq))
      (f64x2.extract_lane 0 (local.get $dMin)) (f64x2.extract_lane 0 (local.get $dMax)) (f64x2.extract_lane 0 (local.get $dSum)))
    (call $finishRow (local.get $i2) (local.get $s2) (local.get $n2) (local.get $nNear2)
      (f64x2.extract_lane 1 (local.get $sum)) (local.get $others) (f64x2.extract_lane 1 (local.get $devSum)) (f64x2.extract_lane 1 (local.get $devSumSq))
      (f64x2.extract_lane 1 (local.get $dMin)) (f64x2.extract_lane 1 (local.get $dMax)) (f64x2.extract_lane 1 (local.get $dSum))))

  ;; A floor under every `keep` a full k-NN list can have from now on: the list's least score x
  ;; only grows (an offer that enters a full list puts out its k-th score, below the new one), so
  ;; every later k-th score is at least x, and every later keep at least keep(x) = x − 4e-12·max(1,
  ;; |x|), which grows with x; the floor is keep(x) less 1e-9·max(1, |keep(x)|) more, so that no
  ;; rounding can lift it over a keep. −∞ (no floor) where that is NaN (x = +∞).
  (func $listFloor (result f64)
    (local $r i32) (local $x f64) (local $least f64) (local $floor f64)
    (local.set $least (f64.const inf))
    (block $done (loop $each
      (br_if $done (i32.ge_s (local.get $r) (global.get $k)))
      (local.set $x (f64.load (i32.add (global.get $best) (i32.shl (local.get $r) (i32.const 3)))))
      (if (f64.lt (local.get $x) (local.get $least)) (then (local.set $least (local.get $x))))
      (local.set $r (i32.add (local.get $r) (i32.const 1)))
      (br $each)))
    (local.set $floor (f64.sub (local.get $least)
      (f64.mul (f64.mul (f64.const 4) (f64.const 1e-12)) (f64.max (f64.const 1) (f64.abs (local.get $least))))))
    (local.set $floor (f64.sub (local.get $floor) (f64.mul (f64.const 1e-9) (f64.max (f64.const 1) (f64.abs (local.get $floor))))))
    (if (result f64) (f64.eq (local.get $floor) (local.get $floor)) (then (local.get $floor)) (else (f64.const -inf))))

  ;; countInRanges(a, n, buckets): false (0), with nothing counted, when the values are all equal.
  (func $countInRanges (param $a i32) (param $n i32) (result i32)
    (local $lo f64) (local $hi f64) (local $x f64) (local $t i32) (local $perUnit f64) (local $b f64) (local $at i32)
    (local.set $lo (f64.const inf))
    (local.set $hi (f64.const -inf))
    (block $done (loop $each
      (br_if $done (i32.ge_s (local.get $t) (local.get $n)))
      (local.set $x (f64.load (i32.add (local.get $a) (i32.shl (local.get $t) (i32.const 3)))))
      (if (f64.lt (local.get $x) (local.get $lo)) (then (local.set $lo (local.get $x))))
      (if (f64.gt (local.get $x) (local.get $hi)) (then (local.set $hi (local.get $x))))
      (local.set $t (i32.add (local.get $t) (i32.const 1)))
      (br $each)))
    (global.set $rLo (local.get $lo))
    (global.set $rHi (local.get $hi))
    (if (i32.eqz (f64.gt (local.get $hi) (local.get $lo))) (then (return (i32.const 0))))
    (local.set $perUnit (f64.div (f64.const 256) (f64.sub (local.get $hi) (local.get $lo))))
    (global.set $rPer (local.get $perUnit))
    (memory.fill (global.get $buckets) (i32.const 0) (i32.const 1024))
    (local.set $t (i32.const 0))
    (block $counted (loop $count
      (br_if $counted (i32.ge_s (local.get $t) (local.get $n)))
      (local.set $b (f64.floor (f64.mul (f64.sub (f64.load (i32.add (local.get $a) (i32.shl (local.get $t) (i32.const 3)))) (local.get $lo)) (local.get $perUnit))))
      (local.set $at (i32.add (global.get $buckets)
        (i32.shl (if (result i32) (f64.lt (local.get $b) (f64.const 255)) (then (i32.trunc_sat_f64_s (local.get $b))) (else (i32.const 255))) (i32.const 2))))
      (i32.store (local.get $at) (i32.add (i32.load (local.get $at)) (i32.const 1)))
      (local.set $t (i32.add (local.get $t) (i32.const 1)))
      (br $count)))
    (i32.const 1))

  ;; radiusBound(…, i, far, others): a squared distance below which about 1.5·far of row i's distances lie.
  (func $radiusBound (param $i i32) (param $far i32) (param $others i32) (result f64)
    (local $base i32) (local $si f64) (local $ni f64) (local $n i32) (local $j i32) (local $at i32) (local $rank f64)
    (local.set $base (i32.mul (local.get $i) (global.get $m)))
    (local.set $si (f64.load (i32.add (global.get $scale) (i32.shl (local.get $i) (i32.const 3)))))
    (local.set $ni (f64.load (i32.add (global.get $norms) (i32.shl (local.get $i) (i32.const 3)))))
    (block $done (loop $each
      (br_if $done (i32.ge_s (local.get $j) (global.get $m)))
      (block $next
        (br_if $next (i32.eq (local.get $j) (local.get $i)))
        (br_if $next (i32.eqz (i32.load8_u (i32.add (global.get $valid) (local.get $j)))))
        (local.set $at (i32.shl (local.get $j) (i32.const 3)))
        (f64.store (i32.add (global.get $probe) (i32.shl (local.get $n) (i32.const 3)))
          (f64.sub (f64.add (local.get $ni) (f64.load (i32.add (global.get $norms) (local.get $at))))
            (f64.mul (f64.const 2)
              (f64.mul (f64.mul (f64.load (i32.add (global.get $gram) (i32.shl (i32.add (local.get $base) (local.get $j)) (i32.const 3)))) (local.get $si))
                (f64.load (i32.add (global.get $scale) (local.get $at)))))))
        (local.set $n (i32.add (local.get $n) (i32.const 1))))
      (local.set $j (i32.add (local.get $j) (i32.const 8)))
      (br $each)))
    ;; rank = ⌈1.5·far·n / max(1, others)⌉ + 4
    (local.set $rank (f64.add (f64.ceil (f64.div
      (f64.mul (f64.mul (f64.const 1.5) (f64.convert_i32_s (local.get $far))) (f64.convert_i32_s (local.get $n)))
      (f64.max (f64.const 1) (f64.convert_i32_s (local.get $others))))) (f64.const 4)))
    (if (result f64) (f64.ge (local.get $rank) (f64.convert_i32_s (i32.sub (local.get $n) (i32.const 1))))
      (then (f64.const inf))
      (else (call $bucketBound (global.get $probe) (local.get $n) (i32.trunc_sat_f64_s (local.get $rank))))))

  ;; bucketBound(a, n, rank): the top of the range where the running count passes rank.
  (func $bucketBound (param $a i32) (param $n i32) (param $rank i32) (result f64)
    (local $b i32) (local $below i32)
    (if (i32.eqz (call $countInRanges (local.get $a) (local.get $n))) (then (return (global.get $rHi))))
    (local.set $below (i32.load (global.get $buckets)))
    (block $found (loop $each
      (br_if $found (i32.gt_s (local.get $below) (local.get $rank)))
      (local.set $b (i32.add (local.get $b) (i32.const 1)))
      (local.set $below (i32.add (local.get $below) (i32.load (i32.add (global.get $buckets) (i32.shl (local.get $b) (i32.const 2))))))
      (br $each)))
    (if (result f64) (i32.ge_s (i32.add (local.get $b) (i32.const 1)) (i32.const 255))
      (then (global.get $rHi))
      (else (f64.add (global.get $rLo) (f64.div (f64.convert_i32_s (i32.add (local.get $b) (i32.const 2))) (global.get $rPer))))))

  ;; gatherDistances(…, i, out): every distance of row i to the other valid rows; the count.
  (func $gatherDistances (param $i i32) (param $out i32) (result i32)
    (local $base i32) (local $si f64) (local $ni f64) (local $nj f64) (local $sq f64) (local $n i32) (local $j i32) (local $at i32)
    (local.set $base (i32.mul (local.get $i) (global.get $m)))
    (local.set $si (f64.load (i32.add (global.get $scale) (i32.shl (local.get $i) (i32.const 3)))))
    (local.set $ni (f64.load (i32.add (global.get $norms) (i32.shl (local.get $i) (i32.const 3)))))
    (block $done (loop $each
      (br_if $done (i32.ge_s (local.get $j) (global.get $m)))
      (block $next
        (br_if $next (i32.eq (local.get $j) (local.get $i)))
        (br_if $next (i32.eqz (i32.load8_u (i32.add (global.get $valid) (local.get $j)))))
        (local.set $at (i32.shl (local.get $j) (i32.const 3)))
        (local.set $nj (f64.load (i32.add (global.get $norms) (local.get $at))))
        (local.set $sq (f64.sub (f64.add (local.get $ni) (local.get $nj))
          (f64.mul (f64.const 2)
            (f64.mul (f64.mul (f64.load (i32.add (global.get $gram) (i32.shl (i32.add (local.get $base) (local.get $j)) (i32.const 3)))) (local.get $si))
              (f64.load (i32.add (global.get $scale) (local.get $at)))))))
        (f64.store (i32.add (local.get $out) (i32.shl (local.get $n) (i32.const 3)))
          (select (f64.sqrt (local.get $sq)) (f64.const 0)
            (f64.gt (local.get $sq) (f64.mul (f64.const 1e-12) (f64.add (local.get $ni) (local.get $nj))))))
        (local.set $n (i32.add (local.get $n) (i32.const 1))))
      (local.set $j (i32.add (local.get $j) (i32.const 1)))
      (br $each)))
    (local.get $n))

  ;; twoRanks(a, n, r1, r2): the values of ranks r1 and r2 among a[0..n) into $rank1, $rank2.
  (func $twoRanks (param $a i32) (param $n i32) (param $r1 i32) (param $r2 i32)
    (local $lo f64) (local $perUnit f64) (local $b1 i32) (local $below1 i32) (local $b2 i32) (local $below2 i32)
    (local $n1 i32) (local $n2 i32) (local $t i32) (local $x f64) (local $raw f64) (local $b i32) (local $scr i32)
    (if (i32.eqz (call $countInRanges (local.get $a) (local.get $n))) (then
      (global.set $rank1 (global.get $rLo))
      (global.set $rank2 (global.get $rLo))
      (return)))
    (local.set $lo (global.get $rLo))
    (local.set $perUnit (global.get $rPer))
    (block $found1 (loop $seek1
      (br_if $found1 (i32.gt_s (i32.add (local.get $below1) (i32.load (i32.add (global.get $buckets) (i32.shl (local.get $b1) (i32.const 2))))) (local.get $r1)))
      (local.set $below1 (i32.add (local.get $below1) (i32.load (i32.add (global.get $buckets) (i32.shl (local.get $b1) (i32.const 2))))))
      (local.set $b1 (i32.add (local.get $b1) (i32.const 1)))
      (br $seek1)))
    (block $found2 (loop $seek2
      (br_if $found2 (i32.gt_s (i32.add (local.get $below2) (i32.load (i32.add (global.get $buckets) (i32.shl (local.get $b2) (i32.const 2))))) (local.get $r2)))
      (local.set $below2 (i32.add (local.get $below2) (i32.load (i32.add (global.get $buckets) (i32.shl (local.get $b2) (i32.const 2))))))
      (local.set $b2 (i32.add (local.get $b2) (i32.const 1)))
      (br $seek2)))
    (local.set $scr (global.get $rscr))
    (local.set $n2 (local.get $n))
    (block $done (loop $each
      (br_if $done (i32.ge_s (local.get $t) (local.get $n)))
      (local.set $x (f64.load (i32.add (local.get $a) (i32.shl (local.get $t) (i32.const 3)))))
      (local.set $raw (f64.floor (f64.mul (f64.sub (local.get $x) (local.get $lo)) (local.get $perUnit))))
      (local.set $b (if (result i32) (f64.lt (local.get $raw) (f64.const 255)) (then (i32.trunc_sat_f64_s (local.get $raw))) (else (i32.const 255))))
      (if (i32.eq (local.get $b) (local.get $b1)) (then
        (f64.store (i32.add (local.get $scr) (i32.shl (local.get $n1) (i32.const 3))) (local.get $x))
        (local.set $n1 (i32.add (local.get $n1) (i32.const 1)))))
      (if (i32.and (i32.eq (local.get $b) (local.get $b2)) (i32.ne (local.get $b2) (local.get $b1))) (then
        (local.set $n2 (i32.sub (local.get $n2) (i32.const 1)))
        (f64.store (i32.add (local.get $scr) (i32.shl (local.get $n2) (i32.const 3))) (local.get $x))))
      (local.set $t (i32.add (local.get $t) (i32.const 1)))
      (br $each)))
    (global.set $rank1 (call $selectRank (local.get $scr) (i32.const 0) (i32.sub (local.get $n1) (i32.const 1)) (i32.sub (local.get $r1) (local.get $below1))))
    (global.set $rank2
      (if (result f64) (i32.eq (local.get $b2) (local.get $b1))
        (then (call $selectRank (local.get $scr) (i32.const 0) (i32.sub (local.get $n1) (i32.const 1)) (i32.sub (local.get $r2) (local.get $below1))))
        (else (call $selectRank (local.get $scr) (local.get $n2) (i32.sub (local.get $n) (i32.const 1))
          (i32.sub (i32.add (local.get $n2) (local.get $r2)) (local.get $below2)))))))

  ;; selectRank(a, lo, hi, rank): Hoare's quickselect, the middle element as pivot (select-rank.ts).
  (func $selectRank (param $a i32) (param $lo i32) (param $hi i32) (param $rank i32) (result f64)
    (local $pivot f64) (local $i i32) (local $j i32) (local $ai i32) (local $aj i32) (local $t f64)
    (block $narrowed (loop $narrow
      (br_if $narrowed (i32.ge_s (local.get $lo) (local.get $hi)))
      (local.set $pivot (f64.load (i32.add (local.get $a) (i32.shl (i32.shr_u (i32.add (local.get $lo) (local.get $hi)) (i32.const 1)) (i32.const 3)))))
      (local.set $i (local.get $lo))
      (local.set $j (local.get $hi))
      (block $parted (loop $part
        (br_if $parted (i32.gt_s (local.get $i) (local.get $j)))
        (block $stopI (loop $upI
          (br_if $stopI (i32.eqz (f64.lt (f64.load (i32.add (local.get $a) (i32.shl (local.get $i) (i32.const 3)))) (local.get $pivot))))
          (local.set $i (i32.add (local.get $i) (i32.const 1)))
          (br $upI)))
        (block $stopJ (loop $downJ
          (br_if $stopJ (i32.eqz (f64.gt (f64.load (i32.add (local.get $a) (i32.shl (local.get $j) (i32.const 3)))) (local.get $pivot))))
          (local.set $j (i32.sub (local.get $j) (i32.const 1)))
          (br $downJ)))
        (if (i32.le_s (local.get $i) (local.get $j)) (then
          (local.set $ai (i32.add (local.get $a) (i32.shl (local.get $i) (i32.const 3))))
          (local.set $aj (i32.add (local.get $a) (i32.shl (local.get $j) (i32.const 3))))
          (local.set $t (f64.load (local.get $ai)))
          (f64.store (local.get $ai) (f64.load (local.get $aj)))
          (f64.store (local.get $aj) (local.get $t))
          (local.set $i (i32.add (local.get $i) (i32.const 1)))
          (local.set $j (i32.sub (local.get $j) (i32.const 1)))))
        (br $part)))
      (if (i32.le_s (local.get $rank) (local.get $j))
        (then (local.set $hi (local.get $j)))
        (else
          (if (i32.ge_s (local.get $rank) (local.get $i))
            (then (local.set $lo (local.get $i)))
            (else (return (f64.load (i32.add (local.get $a) (i32.shl (local.get $rank) (i32.const 3)))))))))
      (br $narrow)))
    (f64.load (i32.add (local.get $a) (i32.shl (local.get $rank) (i32.const 3))))))
