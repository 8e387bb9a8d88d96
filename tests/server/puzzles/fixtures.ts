// Published squared rectangles the puzzle API tests make puzzles from.

/** The simple perfect squared rectangle of order 9, 33 x 32 (squaring.net catalogue; MathWorld credits Moron 1925). */
export const ORDER_9 = '9 33 32 (18,15)(7,8)(14,4)(10,1)(9)';
/** Its nine sizes as published in that code. */
export const ORDER_9_SIZES = [18, 15, 7, 8, 14, 4, 10, 1, 9];

/**
 * An order-13 rectangle whose 13 sizes assemble in two different ways (issue 4 cites it as a
 * published fact; the second way is the classic "twin" of squaring.net's order-13 list).
 */
export const TWIN_13 = '13 112 75 (33,24,19,36)(5,14)(9,20)(42)(11,3)(39)(31)';

/** The order-21 simple perfect squared square, 112 x 112 (Duijvestijn 1978; OEIS A014530): its 21 sizes assemble in exactly one way. */
export const SQUARE_112 = '21 112 112 (50,35,27)(8,19)(15,17,11)(6,24)(29,25,9,2)(7,18)(16)(42)(4,37)(33)';
