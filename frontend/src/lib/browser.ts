/** Full-page navigation away from the single-page app (to the identity provider, for example). */
export const browser = {
  leaveTo(url: string): void {
    window.location.href = url;
  },
};
