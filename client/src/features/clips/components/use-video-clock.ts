import { useCallback, useEffect, useRef, useState, type RefObject } from 'react';
import { stepTime, type Speed } from './clip-time';

/**
 * Far past the end of any clip. Seeking there makes the browser read to the end of a file whose
 * header gave no length (WebM from MediaRecorder reports duration Infinity), which sets its length.
 */
const PROBE_TIME = 1e7;

export interface VideoClock {
  /** Seconds. */
  time: number;
  /** Seconds; NaN until known. */
  duration: number;
  playing: boolean;
  speed: Speed;
  /** The length is being worked out (a WebM clip without one in its header). */
  measuring: boolean;
  seek: (seconds: number) => void;
  /** Pauses, then moves by whole frames (negative goes back). */
  step: (frames: number) => void;
  togglePlay: () => void;
  pause: () => void;
  setSpeed: (speed: Speed) => void;
}

/** Everything the player's own controls need from a <video>, kept in React state. */
export function useVideoClock(ref: RefObject<HTMLVideoElement | null>): VideoClock {
  const [time, setTime] = useState(0);
  const [duration, setDuration] = useState(Number.NaN);
  const [playing, setPlaying] = useState(false);
  const [speed, setSpeedState] = useState<Speed>(1);
  const [measuring, setMeasuring] = useState(false);
  // While measuring, a seek asked for (a note clicked) waits here and wins over going back to 0.
  const pendingSeek = useRef<number | null>(null);
  const probing = useRef(false);

  useEffect(() => {
    const video = ref.current;
    if (!video) return;

    /** `fallback`: the probe's seek has landed but the browser still gives no length; its end position is the length. */
    const finishProbe = (fallback = false) => {
      if (!probing.current) return false;
      const known = Number.isFinite(video.duration) ? video.duration : fallback && video.currentTime > 0 ? video.currentTime : null;
      if (known === null && !fallback) return false;
      probing.current = false;
      setMeasuring(false);
      setDuration(known ?? Number.NaN);
      const to = pendingSeek.current ?? 0;
      pendingSeek.current = null;
      video.currentTime = to;
      setTime(to);
      return true;
    };
    const onMetadata = () => {
      if (Number.isFinite(video.duration)) {
        setDuration(video.duration);
        return;
      }
      probing.current = true;
      setMeasuring(true);
      video.currentTime = PROBE_TIME;
    };
    const onDurationChange = () => {
      if (finishProbe()) return;
      if (!probing.current && Number.isFinite(video.duration)) setDuration(video.duration);
    };
    const onTime = (event: Event) => {
      if (probing.current) {
        finishProbe(event.type === 'seeked');
        return;
      }
      setTime(video.currentTime);
    };
    const onPlay = () => setPlaying(true);
    const onPause = () => {
      setPlaying(false);
      if (!probing.current) setTime(video.currentTime);
    };

    const listeners: [keyof HTMLMediaElementEventMap, (event: Event) => void][] = [
      ['loadedmetadata', onMetadata],
      ['durationchange', onDurationChange],
      ['timeupdate', onTime],
      ['seeked', onTime],
      ['play', onPlay],
      ['pause', onPause],
      ['ended', onPause],
    ];
    for (const [type, listener] of listeners) video.addEventListener(type, listener);
    // The metadata may have arrived before this effect ran.
    if (video.readyState >= HTMLMediaElement.HAVE_METADATA) onMetadata();
    return () => {
      for (const [type, listener] of listeners) video.removeEventListener(type, listener);
    };
  }, [ref]);

  // timeupdate comes about four times a second; while playing, follow each frame so the clock runs smoothly.
  useEffect(() => {
    if (!playing) return;
    let frame = 0;
    const tick = () => {
      const video = ref.current;
      if (video && !probing.current) setTime(video.currentTime);
      frame = requestAnimationFrame(tick);
    };
    frame = requestAnimationFrame(tick);
    return () => cancelAnimationFrame(frame);
  }, [playing, ref]);

  const seek = useCallback(
    (seconds: number) => {
      const video = ref.current;
      if (!video) return;
      video.pause();
      const to = Math.max(0, seconds);
      if (probing.current) {
        pendingSeek.current = to;
      } else {
        video.currentTime = to;
      }
      setTime(to);
    },
    [ref],
  );

  const step = useCallback(
    (frames: number) => {
      const video = ref.current;
      if (!video) return;
      seek(stepTime(probing.current ? (pendingSeek.current ?? 0) : video.currentTime, frames, video.duration));
    },
    [ref, seek],
  );

  const pause = useCallback(() => ref.current?.pause(), [ref]);

  const togglePlay = useCallback(() => {
    const video = ref.current;
    if (!video || probing.current) return;
    if (video.paused || video.ended) void video.play().catch(() => setPlaying(false));
    else video.pause();
  }, [ref]);

  const setSpeed = useCallback(
    (next: Speed) => {
      const video = ref.current;
      if (video) {
        video.playbackRate = next;
        video.defaultPlaybackRate = next;
      }
      setSpeedState(next);
    },
    [ref],
  );

  return { time, duration, playing, speed, measuring, seek, step, togglePlay, pause, setSpeed };
}
