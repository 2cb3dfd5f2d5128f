import ffmpegInstaller from '@ffmpeg-installer/ffmpeg';
import ffprobeInstaller from '@ffprobe-installer/ffprobe';

/** The ffmpeg and ffprobe binaries shipped in npm packages (no system install needed). */
export const FFMPEG_PATH: string = process.env.STANCELINE_FFMPEG ?? ffmpegInstaller.path;
export const FFPROBE_PATH: string = process.env.STANCELINE_FFPROBE ?? ffprobeInstaller.path;
