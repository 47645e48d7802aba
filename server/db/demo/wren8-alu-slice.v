// Wren-8 ALU bit slice (Larkspur Relay Works demo, invented): one bit of the 8-bit ALU in gate primitives.
// A full adder (sum S, carry out CO) and the logic results AND, OR, XOR of the operands A and B,
// selected onto R by the operation lines OPADD, OPAND, OPOR, OPXOR.
// What a scan finds, left over from the board's first revision:
//  - the carry-in gate still has its spare subtract input strapped high: constant-input;
//  - the carry out is buffered by two inverters in a row: double-inversion;
//  - the logic XOR and AND are built a second time beside the adder's own A ^ B and A & B:
//    merge-duplicate-logic (and shared-control-driver);
//  - the carry and the result selector have cheaper two-level forms: two-level-minimise.
module wren8_alu_slice(A, B, CI, OPADD, OPAND, OPOR, OPXOR, R, CO);
  input A, B, CI, OPADD, OPAND, OPOR, OPXOR;
  output R, CO;
  wire CIN, P, G, T, S, C, CN, LAND, LOR, LXOR, RA, RB, RC, RD;
  and g_cin (CIN, CI, 1'b1);
  xor g_p (P, A, B);
  and g_g (G, A, B);
  xor g_s (S, P, CIN);
  and g_t (T, P, CIN);
  or g_c (C, G, T);
  not g_cn (CN, C);
  not g_co (CO, CN);
  and g_land (LAND, A, B);
  or g_lor (LOR, A, B);
  xor g_lxor (LXOR, A, B);
  and g_ra (RA, OPADD, S);
  and g_rb (RB, OPAND, LAND);
  and g_rc (RC, OPOR, LOR);
  and g_rd (RD, OPXOR, LXOR);
  or g_r (R, RA, RB, RC, RD);
endmodule
