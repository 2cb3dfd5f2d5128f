// Types for the parts of webvtt-parser (the W3C validator's parser) the notes tests use.
declare module 'webvtt-parser' {
  export interface VttNode {
    type: 'object' | 'text' | 'timestamp';
    name?: string;
    value?: string;
    children?: VttNode[];
  }
  export interface VttCue {
    id: string;
    startTime: number;
    endTime: number;
    text: string;
    tree: VttNode;
  }
  export class WebVTTParser {
    constructor(entities?: Record<string, string>);
    parse(input: string, mode?: string): { cues: VttCue[]; errors: { message: string; line: number }[] };
  }
}
