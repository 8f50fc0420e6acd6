;; Reads a run of JSON array elements that are plain numbers, each followed at once by "," or "]":
;; the hot loop of JSON sample bodies (json-samples.ts), where a 10,000-sample {"t","a"} batch is
;; 20,000 numbers. number-run.ts copies the body's bytes into this module's memory and calls
;; numberRun; the readings land in the output area as float64.
;;
;; It takes only what it reads exactly, and stops at anything else, for the JavaScript reader to
;; read or to name the error: whitespace, strings, literals, an exponent, a number cut by the end of
;; the bytes it was given, "01", "1.", more than 18 digits or a mantissa over 2^53. So it never
;; decides an error.
;;
;; Value: Clinger's fast path. The digits, without the point, make an integer mantissa m of at most
;; 2^53 (exact as a double), and 10^f, for the f <= 18 digits after the point, is exact as a double
;; too (every power up to 10^22 is); so the one division m / 10^f is correctly rounded (IEEE 754), the same double as JSON.parse and
;; Number() give for that text (W. D. Clinger, "How to Read Floating Point Numbers Accurately",
;; PLDI 1990).
;;
;; Compiled to number-run.wasm by `npm run wasm -w api` (wabt); a test checks that the two agree.
(module
  (memory (export "memory") 5)

  ;; Memory layout (bytes): 10^0..10^22 as float64 at 0; the output area; the input area to the end.
  (global $outputAt (export "outputAt") i32 (i32.const 256))
  (global $outputCapacity (export "outputCapacity") i32 (i32.const 4096))
  (global (export "inputAt") i32 (i32.const 65536))
  (global (export "inputCapacity") i32 (i32.const 262144))

  ;; Set by numberRun: the index after the last "," or "]" taken (its p when it took nothing), and
  ;; 1 when the run ended with "]".
  (global $stop (export "stop") (mut i32) (i32.const 0))
  (global $closed (export "closed") (mut i32) (i32.const 0))

  ;; The powers of ten: each product is exact, as every 10^k up to 10^22 is a double.
  (func $powersOfTen
    (local $k i32) (local $x f64)
    (local.set $x (f64.const 1))
    (loop $next
      (f64.store (i32.shl (local.get $k) (i32.const 3)) (local.get $x))
      (local.set $x (f64.mul (local.get $x) (f64.const 10)))
      (local.set $k (i32.add (local.get $k) (i32.const 1)))
      (br_if $next (i32.le_u (local.get $k) (i32.const 22)))))
  (start $powersOfTen)

  ;; Reads elements from byte p (an element's first byte) up to byte end, at most until the output
  ;; area holds outputCapacity values; returns how many it read.
  (func (export "numberRun") (param $p i32) (param $end i32) (result i32)
    (local $i i32) (local $c i32) (local $negative i32) (local $m i64) (local $digits i32)
    (local $fraction i32) (local $v f64) (local $o i32) (local $oEnd i32)
    (global.set $closed (i32.const 0))
    (local.set $o (global.get $outputAt))
    (local.set $oEnd (i32.add (global.get $outputAt) (i32.shl (global.get $outputCapacity) (i32.const 3))))
    (block $done
      (loop $element
        (br_if $done (i32.ge_u (local.get $o) (local.get $oEnd)))
        (local.set $i (local.get $p))
        (br_if $done (i32.ge_u (local.get $i) (local.get $end)))
        (local.set $c (i32.load8_u (local.get $i)))
        ;; sign
        (local.set $negative (i32.eq (local.get $c) (i32.const 45)))
        (if (local.get $negative) (then
          (local.set $i (i32.add (local.get $i) (i32.const 1)))
          (br_if $done (i32.ge_u (local.get $i) (local.get $end)))
          (local.set $c (i32.load8_u (local.get $i)))))
        (local.set $m (i64.const 0))
        (local.set $digits (i32.const 0))
        (local.set $fraction (i32.const 0))
        ;; integer part: "0", or a digit 1-9 and more digits
        (if (i32.eq (local.get $c) (i32.const 48))
          (then (local.set $i (i32.add (local.get $i) (i32.const 1))))
          (else
            (br_if $done (i32.gt_u (i32.sub (local.get $c) (i32.const 49)) (i32.const 8)))
            (loop $integer
              (local.set $m (i64.add (i64.mul (local.get $m) (i64.const 10)) (i64.extend_i32_u (i32.sub (local.get $c) (i32.const 48)))))
              (local.set $digits (i32.add (local.get $digits) (i32.const 1)))
              (local.set $i (i32.add (local.get $i) (i32.const 1)))
              (br_if $done (i32.ge_u (local.get $i) (local.get $end)))
              (local.set $c (i32.load8_u (local.get $i)))
              (br_if $integer (i32.le_u (i32.sub (local.get $c) (i32.const 48)) (i32.const 9))))))
        (br_if $done (i32.ge_u (local.get $i) (local.get $end)))
        (local.set $c (i32.load8_u (local.get $i)))
        ;; fraction: "." and at least one digit
        (if (i32.eq (local.get $c) (i32.const 46)) (then
          (local.set $i (i32.add (local.get $i) (i32.const 1)))
          (br_if $done (i32.ge_u (local.get $i) (local.get $end)))
          (local.set $c (i32.load8_u (local.get $i)))
          (br_if $done (i32.gt_u (i32.sub (local.get $c) (i32.const 48)) (i32.const 9)))
          (loop $decimals
            (local.set $m (i64.add (i64.mul (local.get $m) (i64.const 10)) (i64.extend_i32_u (i32.sub (local.get $c) (i32.const 48)))))
            (local.set $digits (i32.add (local.get $digits) (i32.const 1)))
            (local.set $fraction (i32.add (local.get $fraction) (i32.const 1)))
            (local.set $i (i32.add (local.get $i) (i32.const 1)))
            (br_if $done (i32.ge_u (local.get $i) (local.get $end)))
            (local.set $c (i32.load8_u (local.get $i)))
            (br_if $decimals (i32.le_u (i32.sub (local.get $c) (i32.const 48)) (i32.const 9))))))
        ;; exact only (18 digits cannot overflow the 64-bit mantissa), then "," or "]" at once
        (br_if $done (i32.gt_u (local.get $digits) (i32.const 18)))
        (br_if $done (i64.gt_u (local.get $m) (i64.const 9007199254740992)))
        (br_if $done (i32.and (i32.ne (local.get $c) (i32.const 44)) (i32.ne (local.get $c) (i32.const 93))))
        (local.set $v (f64.div (f64.convert_i64_u (local.get $m)) (f64.load (i32.shl (local.get $fraction) (i32.const 3)))))
        (if (local.get $negative) (then (local.set $v (f64.neg (local.get $v)))))
        (f64.store (local.get $o) (local.get $v))
        (local.set $o (i32.add (local.get $o) (i32.const 8)))
        (local.set $p (i32.add (local.get $i) (i32.const 1)))
        (if (i32.eq (local.get $c) (i32.const 93)) (then
          (global.set $closed (i32.const 1))
          (br $done)))
        (br $element)))
    (global.set $stop (local.get $p))
    (i32.shr_u (i32.sub (local.get $o) (global.get $outputAt)) (i32.const 3))))
