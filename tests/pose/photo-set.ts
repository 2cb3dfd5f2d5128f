// Real photographs of people with hip, knee and ankle marked by hand, for the knee-flexion evaluation
// (tests/pose/photo-eval.ts). The pictures are OpenCV's sample data as Debian's opencv-doc package
// carries it (extracted and checked by sha256 in tests/pose/fetch-photo.sh):
//  - messi5.jpg, 548×342: a footballer kicking, one knee deeply bent;
//  - basketball1.png, 640×480 greyscale: two men passing a ball indoors; the left one is whole;
//  - vtest.avi, 768×576 at 10 frames/s: pedestrians on a campus seen from a first-floor window, 80–115 px
//    tall, which is how a skier far up the hill looks in a phone clip. Frames 20, 200, 400 and 600.
//
// Marked by hand (points marked as such, not from any library) on 2.5–6× zooms with a 5 or 10 px grid,
// before any model was run on these pictures; not moved afterwards. Joints hidden under jackets and
// loose trousers (hips, knees in jeans) are where the outline puts them: about ±3 px on the walkers and
// ±5 px on the two large figures, which is ±5–10° of knee angle on a 20 px thigh. Each leg's sides are
// not named: the evaluation pairs the model's legs with the marked legs by position, because left and
// right of a 100 px walker cannot be told reliably by eye.
//
// Each walker is read on a square crop around them (about 1.6× their height) so that one person is the
// subject, as on a photo taken of them; the crop is part of the picture, the same for every method.

export type Point = [number, number];

export interface MarkedLeg {
  hip: Point;
  knee: Point;
  ankle: Point;
}

export interface MarkedPhoto {
  id: string;
  /** File under fixtures/generated/photos/opencv/. */
  file: string;
  /** Square or rectangle read from the picture: x, y, width, height in its pixels. */
  crop: [number, number, number, number] | null;
  /** Two legs in the whole picture's pixels, in no particular side order. */
  legs: [MarkedLeg, MarkedLeg];
  what: string;
}

export const PHOTO_SET: readonly MarkedPhoto[] = [
  {
    id: 'kick',
    file: 'messi5.jpg',
    crop: null,
    what: 'footballer kicking, support knee bent, kicking leg stretched',
    legs: [
      { hip: [240, 250], knee: [224, 287], ankle: [265, 325] },
      { hip: [293, 232], knee: [352, 255], ankle: [422, 267] },
    ],
  },
  {
    id: 'catch',
    file: 'basketball1.png',
    // The left half only: the other man fills the right half, cut at the waist.
    crop: [0, 0, 300, 480],
    what: 'man catching a ball, standing, legs nearly straight',
    legs: [
      { hip: [64, 293], knee: [62, 378], ankle: [52, 455] },
      { hip: [110, 293], knee: [114, 378], ankle: [124, 452] },
    ],
  },
  {
    id: 'walker-20a',
    file: 'vtest-20.png',
    crop: [310, 173, 130, 130],
    what: 'walker from behind, legs nearly straight',
    legs: [
      { hip: [372, 246], knee: [371, 262], ankle: [369, 278] },
      { hip: [380, 246], knee: [384, 262], ankle: [391, 277] },
    ],
  },
  {
    id: 'walker-20b',
    file: 'vtest-20.png',
    crop: [392, 207, 136, 136],
    what: 'walker in profile, mid-stride, long coat',
    legs: [
      { hip: [455, 290], knee: [448, 300], ankle: [440, 312] },
      { hip: [461, 290], knee: [468, 300], ankle: [477, 312] },
    ],
  },
  {
    id: 'walker-200a',
    file: 'vtest-200.png',
    crop: [166, 165, 132, 132],
    what: 'walker toward the camera, feet apart, jeans',
    legs: [
      { hip: [227, 240], knee: [225, 255], ankle: [222, 268] },
      { hip: [237, 240], knee: [240, 255], ankle: [245, 270] },
    ],
  },
  {
    id: 'walker-200b',
    file: 'vtest-200.png',
    crop: [548, 235, 164, 164],
    what: 'walker three-quarters toward the camera, jeans',
    legs: [
      { hip: [624, 322], knee: [622, 342], ankle: [621, 362] },
      { hip: [634, 322], knee: [636, 342], ankle: [641, 362] },
    ],
  },
  {
    id: 'walker-400',
    file: 'vtest-400.png',
    crop: [592, 267, 176, 176],
    what: 'walker in profile, heel strike',
    legs: [
      { hip: [708, 366], knee: [699, 385], ankle: [692, 401] },
      { hip: [713, 366], knee: [721, 386], ankle: [731, 404] },
    ],
  },
  {
    id: 'walker-600a',
    file: 'vtest-600.png',
    crop: [380, 270, 184, 184],
    what: 'walker in profile, red jacket, mid-stride',
    legs: [
      { hip: [463, 376], knee: [460, 395], ankle: [462, 411] },
      { hip: [470, 376], knee: [480, 393], ankle: [494, 406] },
    ],
  },
  {
    id: 'walker-600b',
    file: 'vtest-600.png',
    crop: [508, 174, 140, 140],
    what: 'walker from behind, turning, jeans',
    legs: [
      { hip: [572, 253], knee: [572, 268], ankle: [573, 283] },
      { hip: [582, 253], knee: [582, 268], ankle: [587, 284] },
    ],
  },
  {
    id: 'walker-600c',
    file: 'vtest-600.png',
    crop: [615, 170, 136, 136],
    what: 'walker three-quarters toward the camera, dark trousers',
    legs: [
      { hip: [677, 262], knee: [674, 278], ankle: [673, 291] },
      { hip: [687, 262], knee: [689, 278], ankle: [691, 292] },
    ],
  },
];
