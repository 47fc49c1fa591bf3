// The words of the "waiting to send" note (waiting-on-this-device.tsx). The note sits in the router's
// error page, in the main bundle that staff load too, so it holds no translation code: it takes these
// words as a prop, English by default, and the tenant's words come from tenant-root.tsx (loaded only
// when the language on this device is not English).
export interface WaitingWords {
  title: string;
  body: string;
}

export const englishWaitingWords: WaitingWords = {
  title: "Your report is waiting to send",
  body: "A report is kept on this phone, waiting to send. It will send by itself when you are back online and Dewline opens again.",
};
