// Wren-8 front-panel display decoder (Larkspur Relay Works demo, invented): BCD to seven segments.
// Each segment is written straight from the truth table as an OR of the BCD codes 0-9 that
// light it (codes 10-15 light nothing); B3 is the most significant bit; 6 lights segment a,
// 7 lights a b c, 9 lights d.
// What a scan finds: every segment has a smaller two-level form (two-level-minimise). The digit
// shown comes from a BCD counter that only ever holds 0-9, so codes 10-15 never occur; stated as
// the assumption !(B3 & (B2 | B1)), they become don't-cares and the covers shrink further. Each
// minterm inverts its own copies of the inputs: those inverters can be shared (shared-control-driver,
// merge-duplicate-logic).
module wren8_seven_segment(B3, B2, B1, B0, SA, SB, SC, SD, SE, SF, SG);
  input B3, B2, B1, B0;
  output SA, SB, SC, SD, SE, SF, SG;
  // segment a: codes 0, 2, 3, 5, 6, 7, 8, 9
  assign SA = (~B3 & ~B2 & ~B1 & ~B0)
      | (~B3 & ~B2 & B1 & ~B0)
      | (~B3 & ~B2 & B1 & B0)
      | (~B3 & B2 & ~B1 & B0)
      | (~B3 & B2 & B1 & ~B0)
      | (~B3 & B2 & B1 & B0)
      | (B3 & ~B2 & ~B1 & ~B0)
      | (B3 & ~B2 & ~B1 & B0);
  // segment b: codes 0, 1, 2, 3, 4, 7, 8, 9
  assign SB = (~B3 & ~B2 & ~B1 & ~B0)
      | (~B3 & ~B2 & ~B1 & B0)
      | (~B3 & ~B2 & B1 & ~B0)
      | (~B3 & ~B2 & B1 & B0)
      | (~B3 & B2 & ~B1 & ~B0)
      | (~B3 & B2 & B1 & B0)
      | (B3 & ~B2 & ~B1 & ~B0)
      | (B3 & ~B2 & ~B1 & B0);
  // segment c: codes 0, 1, 3, 4, 5, 6, 7, 8, 9
  assign SC = (~B3 & ~B2 & ~B1 & ~B0)
      | (~B3 & ~B2 & ~B1 & B0)
      | (~B3 & ~B2 & B1 & B0)
      | (~B3 & B2 & ~B1 & ~B0)
      | (~B3 & B2 & ~B1 & B0)
      | (~B3 & B2 & B1 & ~B0)
      | (~B3 & B2 & B1 & B0)
      | (B3 & ~B2 & ~B1 & ~B0)
      | (B3 & ~B2 & ~B1 & B0);
  // segment d: codes 0, 2, 3, 5, 6, 8, 9
  assign SD = (~B3 & ~B2 & ~B1 & ~B0)
      | (~B3 & ~B2 & B1 & ~B0)
      | (~B3 & ~B2 & B1 & B0)
      | (~B3 & B2 & ~B1 & B0)
      | (~B3 & B2 & B1 & ~B0)
      | (B3 & ~B2 & ~B1 & ~B0)
      | (B3 & ~B2 & ~B1 & B0);
  // segment e: codes 0, 2, 6, 8
  assign SE = (~B3 & ~B2 & ~B1 & ~B0)
      | (~B3 & ~B2 & B1 & ~B0)
      | (~B3 & B2 & B1 & ~B0)
      | (B3 & ~B2 & ~B1 & ~B0);
  // segment f: codes 0, 4, 5, 6, 8, 9
  assign SF = (~B3 & ~B2 & ~B1 & ~B0)
      | (~B3 & B2 & ~B1 & ~B0)
      | (~B3 & B2 & ~B1 & B0)
      | (~B3 & B2 & B1 & ~B0)
      | (B3 & ~B2 & ~B1 & ~B0)
      | (B3 & ~B2 & ~B1 & B0);
  // segment g: codes 2, 3, 4, 5, 6, 8, 9
  assign SG = (~B3 & ~B2 & B1 & ~B0)
      | (~B3 & ~B2 & B1 & B0)
      | (~B3 & B2 & ~B1 & ~B0)
      | (~B3 & B2 & ~B1 & B0)
      | (~B3 & B2 & B1 & ~B0)
      | (B3 & ~B2 & ~B1 & ~B0)
      | (B3 & ~B2 & ~B1 & B0);
endmodule
